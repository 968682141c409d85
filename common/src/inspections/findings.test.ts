import { describe, expect, it } from 'vitest';
import {
  CRACK_WIDTH_PATTERN,
  FINDINGS_ITEMS,
  FINDINGS_ITEM_KEYS,
  missingFindings,
  type InspectionFindings,
} from './findings';

const complete: InspectionFindings = {
  interiorCracks: [{ location: 'Kitchen, above the sink', widthIn: '0.125', orientation: 'diagonal' }],
  exteriorCracks: [],
  doorsWindowsSticking: [],
  floorSlope: { observed: true, note: 'Ball rolls toward the back bedroom' },
  erosion: { observed: false },
  drainage: { gutters: 'partial', downspoutsDischargeNearFoundation: true, grading: 'toward' },
  wallRotation: { observed: false },
  plumbingLeaks: { observed: false },
  soil: { type: 'clay', moisture: 'dry' },
};

describe('the findings checklist', () => {
  it('lists every item of the findings type once, in form order', () => {
    expect(FINDINGS_ITEM_KEYS).toEqual(Object.keys(complete));
    expect(new Set(FINDINGS_ITEM_KEYS).size).toBe(FINDINGS_ITEMS.length);
  });

  it('carries the structural caution on wall rotation', () => {
    expect(FINDINGS_ITEMS.find((i) => i.key === 'wallRotation')?.caution).toMatch(/licensed engineer/);
  });
});

describe('missingFindings', () => {
  it.each([
    ['nothing saved', null, FINDINGS_ITEM_KEYS],
    ['an empty object', {}, FINDINGS_ITEM_KEYS],
    ['every item answered', complete, []],
    ['empty lists count as answers', { ...complete, interiorCracks: [] }, []],
    ['one item left out', { ...complete, soil: undefined }, ['soil']],
    ['an item set to null', { ...complete, drainage: null }, ['drainage']],
    [
      'only the lists answered',
      { interiorCracks: [], exteriorCracks: [], doorsWindowsSticking: [] },
      ['floorSlope', 'erosion', 'drainage', 'wallRotation', 'plumbingLeaks', 'soil'],
    ],
  ])('%s', (_name, findings, missing) => {
    expect(missingFindings(findings as Partial<InspectionFindings> | null)).toEqual(missing);
  });
});

describe('CRACK_WIDTH_PATTERN', () => {
  it.each([
    ['0.0625', true], // 1/16 in
    ['0.125', true],
    ['0.25', true],
    ['1', true],
    ['12.5', true],
    ['0', false], // a crack has a width
    ['0.0', false],
    ['0.00001', false], // more than 4 decimals
    ['100', false],
    ['-0.1', false],
    ['.5', false],
    ['1/8', false],
    ['0.5 ', false],
  ])('%j → %s', (value, ok) => {
    expect(CRACK_WIDTH_PATTERN.test(value)).toBe(ok);
  });
});
