import { describe, expect, it } from 'vitest';
import { commissionPreview } from './commission';

describe('commissionPreview', () => {
  it.each([
    // netTotal, grossProfit, ratePct, basis, amount — computed by hand
    ['3705.00', '1941.00', '8', 'net', '296.40'], // 3705 × 0.08
    ['3705.00', '1941.00', '8', 'margin', '155.28'], // 1941 × 0.08
    ['1000.05', '400.00', '7.5', 'net', '75.00'], // 75.00375 → 75.00 (half-up, once)
    ['1000.10', '400.00', '7.5', 'net', '75.01'], // 75.0075 → 75.01
    ['500.00', '-20.00', '10', 'margin', '0.00'], // no commission on a loss
    ['0.00', '-40.00', '10', 'net', '0.00'],
    ['500.00', '100.00', '0', 'net', '0.00'],
  ] as const)('net %s, profit %s at %s%% on %s → %s', (netTotal, grossProfit, ratePct, basis, amount) => {
    expect(commissionPreview({ netTotal, grossProfit, ratePct, basis })).toBe(amount);
  });

  it('refuses a negative rate', () => {
    expect(() =>
      commissionPreview({ netTotal: '1', grossProfit: '1', ratePct: '-1', basis: 'net' }),
    ).toThrow();
  });
});
