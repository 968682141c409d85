import { describe, expect, it } from 'vitest';
import { compareSurveys } from './survey-compare';

// The inspection's survey: B reads 1.0 in lower than A, 25 ft away → β = 1/300 (REFERENCE-VALUES.md
// worked example: 1.0 in over 25 ft (300 in) → 1/300; Skempton & MacDonald 1956 "first cracking", secondary).
const BEFORE = [
  { label: 'A', xFt: '0', yFt: '0', elevationIn: '0', isReference: true },
  { label: 'B', xFt: '25', yFt: '0', elevationIn: '-1' },
  { label: 'C', xFt: '0', yFt: '25', elevationIn: '-0.25' },
];
// After the repair B reads 0.25 in below A: 0.25 in over 300 in → 1/1200 (same arithmetic).
const AFTER = [
  { label: 'A', xFt: '0.00', yFt: '0.00', elevationIn: '0.00', isReference: true },
  { label: 'B', xFt: '25.00', yFt: '0.00', elevationIn: '-0.25' },
  { label: 'C', xFt: '0.00', yFt: '25.00', elevationIn: '-0.25' },
  { label: 'D', xFt: '25.00', yFt: '25.00', elevationIn: '-0.30' },
];

describe('compareSurveys', () => {
  it('screens both sides with the settlement calculator and lists the change per label', () => {
    const c = compareSurveys(BEFORE, AFTER);
    expect(c.beforeMaxDifferentialIn).toBe('1');
    expect(c.beforeWorstRatio).toBe('1/300');
    // After: highest A 0, lowest D −0.30 → 0.3 in; worst pair A–B or A–C 0.25 in over 300 in = 1/1200
    // (A–D is 0.30 in over 35.36 ft = 424.26 in → 1/1414; C–D 0.05 in over 300 in → 1/6000).
    expect(c.afterMaxDifferentialIn).toBe('0.3');
    expect(c.afterWorstRatio).toBe('1/1200');
    expect(c.changes).toEqual([
      { label: 'A', beforeIn: '0', afterIn: '0', changeIn: '0' },
      { label: 'B', beforeIn: '-1', afterIn: '-0.25', changeIn: '0.75' },
      { label: 'C', beforeIn: '-0.25', afterIn: '-0.25', changeIn: '0' },
    ]);
    expect(c.after.map((p) => p.label)).toEqual(['A', 'B', 'C', 'D']);
    expect(c.after[1]).toEqual({ label: 'B', xFt: '25', yFt: '0', elevationIn: '-0.25' });
    expect(c.sameReference).toBe(true);
    expect(c.beforeBand).toContain('1/300');
    expect(c.caution).toMatch(/not an engineering determination/);
  });

  it('shows the before side alone until the re-survey exists', () => {
    const c = compareSurveys(BEFORE, []);
    expect(c.beforeWorstRatio).toBe('1/300');
    expect(c.afterWorstRatio).toBeNull();
    expect(c.afterMaxDifferentialIn).toBeNull();
    expect(c.changes).toEqual([]);
    expect(c.sameReference).toBe(false);
  });

  it('has nothing to compare without an inspection survey', () => {
    const c = compareSurveys([], AFTER);
    expect(c.beforeMaxDifferentialIn).toBeNull();
    expect(c.afterWorstRatio).toBe('1/1200');
    expect(c.changes).toEqual([]);
  });
});
