import { describe, expect, it } from 'vitest';
import { settlement, SETTLEMENT_CAUTION } from '../calculators/settlement';
import { FINDINGS_CAUTION, FINDINGS_ITEM_KEYS } from '../inspections/findings';
import { describeFindings, findingsSummary, summariseSurvey } from './findings-summary';

const byKey = (items: ReturnType<typeof describeFindings>) =>
  Object.fromEntries(items.map((i) => [i.key, i]));

describe('describeFindings', () => {
  it('lists every checklist item in order, "Not recorded." for the unanswered', () => {
    const items = describeFindings({});
    expect(items.map((i) => i.key)).toEqual(FINDINGS_ITEM_KEYS);
    expect(items.every((i) => i.lines[0] === 'Not recorded.')).toBe(true);
  });

  it.each([
    ['interiorCracks', [], ['None seen.']],
    [
      'interiorCracks',
      [{ location: 'Living room, NE corner', widthIn: '0.125', orientation: 'diagonal' }],
      ['Living room, NE corner: 0.125 in wide, diagonal'],
    ],
    [
      'exteriorCracks',
      [{ location: 'East brick wall', widthIn: '0.25', orientation: 'stair_step', note: 'Widens upward' }],
      ['East brick wall: 0.25 in wide, stair-step (along mortar joints) (Widens upward)'],
    ],
    ['doorsWindowsSticking', [{ location: 'Back bedroom door' }], ['Back bedroom door']],
    ['floorSlope', { observed: true, note: 'Ball rolls to the back' }, ['Observed (Ball rolls to the back)']],
    ['erosion', { observed: false }, ['Not observed']],
    [
      'drainage',
      { gutters: 'partial', downspoutsDischargeNearFoundation: true, grading: 'toward' },
      [
        'Gutters on part of the roof line',
        'Downspouts discharge near the foundation',
        'Ground: slopes toward the house',
      ],
    ],
    ['soil', { type: 'clay', moisture: 'dry' }, ['Clay, dry']],
  ])('%s %j → %j', (key, value, lines) => {
    expect(byKey(describeFindings({ [key]: value }))[key]!.lines).toEqual(lines);
  });

  it('shows the wall-rotation caution only when rotation was observed', () => {
    expect(byKey(describeFindings({ wallRotation: { observed: true } })).wallRotation!.caution).toContain(
      'licensed engineer',
    );
    expect(byKey(describeFindings({ wallRotation: { observed: false } })).wallRotation!.caution).toBeNull();
  });
});

describe('summariseSurvey', () => {
  it('keeps the headline figures and always the screening caution', () => {
    // 1.0 in over 25 ft (300 in) → β = 1/300 (REFERENCE-VALUES.md worked example), band beyond-1/300
    // (Skempton & MacDonald 1956, secondary).
    const result = settlement({
      points: [
        { label: 'A', xFt: '0', yFt: '0', elevationIn: '0' },
        { label: 'B', xFt: '25', yFt: '0', elevationIn: '-1' },
      ],
    });
    const s = summariseSurvey(result)!;
    expect(s).toMatchObject({
      pointCount: 2,
      maxDifferentialIn: '1',
      worstRatio: '1/300',
      highestLabel: 'A',
      lowestLabel: 'B',
      band: { code: 'beyond-1/300' },
      caution: SETTLEMENT_CAUTION,
    });
    expect(s.caution).toContain('not an engineering determination');
    expect(summariseSurvey(null)).toBeNull();
  });

  it('wraps it all with the findings caution', () => {
    const f = findingsSummary({
      inspectionId: 'i',
      inspectedOn: '2026-06-30',
      summary: '  ',
      findings: { soil: { type: 'sand', moisture: 'wet' } },
      survey: null,
    });
    expect(f.summary).toBeNull();
    expect(f.caution).toBe(FINDINGS_CAUTION);
    expect(byKey(f.items).soil!.lines).toEqual(['Sand, wet']);
  });
});
