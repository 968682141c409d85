import { describe, expect, it } from 'vitest';
import type { CompletionChecklist, SurveyPointInput } from './api-types';
import { checkCompletionChecklist, checkResurvey, COMPLETION_CHECKLIST_ITEMS } from './completion';

const ALL_YES: CompletionChecklist = {
  siteCleaned: true,
  injectionHolesPatched: true,
  plumbingChecked: true,
  doorsWindowsChecked: true,
  drainageRestored: true,
  homeownerWalkthrough: true,
};

describe('checkCompletionChecklist', () => {
  it('has six items, each with a label', () => {
    expect(COMPLETION_CHECKLIST_ITEMS.map((i) => i.key)).toEqual(Object.keys(ALL_YES));
  });

  it.each([
    ['every item yes', ALL_YES, null, [], []],
    [
      'two missing',
      { ...ALL_YES, plumbingChecked: undefined, drainageRestored: null },
      null,
      ['plumbingChecked', 'drainageRestored'],
      ['checklist.plumbingChecked', 'checklist.drainageRestored'],
    ],
    ['nothing sent', null, null, Object.keys(ALL_YES), Object.keys(ALL_YES).map((k) => `checklist.${k}`)],
    ['a "no" without a note', { ...ALL_YES, drainageRestored: false }, '  ', [], ['note']],
    [
      'a "no" with a note',
      { ...ALL_YES, drainageRestored: false },
      'Downspout extension on back order',
      [],
      [],
    ],
    [
      'a string is no answer',
      { ...ALL_YES, siteCleaned: 'yes' },
      null,
      ['siteCleaned'],
      ['checklist.siteCleaned'],
    ],
  ] as [string, never, string | null, string[], string[]][])(
    '%s',
    (_name, checklist, note, unanswered, errorFields) => {
      const c = checkCompletionChecklist(checklist, note);
      expect(c.unanswered).toEqual(unanswered);
      expect(c.errors.map((e) => e.field)).toEqual(errorFields);
    },
  );
});

describe('checkResurvey', () => {
  const good: SurveyPointInput[] = [
    { label: 'A', xFt: '0', yFt: '0', elevationIn: '0', isReference: true },
    { label: 'B', xFt: '25', yFt: '0', elevationIn: '-0.25' },
    { label: 'C', xFt: '0', yFt: '25', elevationIn: '-0.25' },
  ];
  const withPatch = (i: number, patch: Partial<SurveyPointInput>) =>
    good.map((p, j) => (j === i ? { ...p, ...patch } : p));

  it.each([
    ['three points, one reference at 0', good, []],
    ['two points', good.slice(0, 2), ['resurvey']],
    ['no reference', withPatch(0, { isReference: false }), ['resurvey']],
    ['two references', withPatch(1, { isReference: true }), ['resurvey']],
    ['reference not at 0', withPatch(0, { elevationIn: '0.5' }), ['resurvey[0].elevationIn']],
    ['a label twice', withPatch(2, { label: 'B' }), ['resurvey[2].label']],
    ['a blank label', withPatch(2, { label: ' ' }), ['resurvey[2].label']],
    ['three decimals', withPatch(1, { elevationIn: '-0.255' }), ['resurvey[1].elevationIn']],
    ['a number, not a string', withPatch(1, { xFt: 25 as never }), ['resurvey[1].xFt']],
  ] as [string, SurveyPointInput[], string[]][])('%s → %j', (_name, points, expected) => {
    expect(checkResurvey(points).map((e) => e.field)).toEqual(expected);
  });
});
