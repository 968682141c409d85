// Completing a job: the final checklist and the re-survey of floor elevations.
//
// Checklist: every item must be answered (true = done / checked, false = not). An item answered "no"
// needs the completion note to say why (our rule: the record then explains itself). Re-survey: at least
// 3 points (a plane needs three; our choice, the brief's minimum), unique labels, exactly one reference
// point whose own elevation reads 0 (every other reading is measured from it, as on the inspection's
// survey), decimals with at most 2 places (numeric(8,2)).
import type { FieldError } from '../api/types';
import { parseStrictDecimal } from '../calculators/decimal';
import { SETTLEMENT_MAX_POINTS } from '../calculators/settlement';
import type { CompletionChecklist, SurveyPointInput } from './api-types';

export const COMPLETION_CHECKLIST_ITEMS: readonly { key: keyof CompletionChecklist; label: string }[] = [
  { key: 'siteCleaned', label: 'Site cleaned up, spoil and packaging removed' },
  { key: 'injectionHolesPatched', label: 'Injection and pier holes patched' },
  { key: 'plumbingChecked', label: 'Plumbing checked for leaks after the work' },
  { key: 'doorsWindowsChecked', label: 'Doors and windows checked for sticking' },
  { key: 'drainageRestored', label: 'Drainage, gutters and downspouts put back' },
  { key: 'homeownerWalkthrough', label: 'Walk-through with the homeowner' },
];

export const RESURVEY_MIN_POINTS = 3;
export const SURVEY_LABEL_MAX = 16;

export interface ChecklistCheck {
  /** Keys of the items with no answer (missing or null), in checklist order. */
  unanswered: (keyof CompletionChecklist)[];
  /** Keys answered "no". */
  answeredNo: (keyof CompletionChecklist)[];
  /** One entry per problem, for the form. */
  errors: FieldError[];
}

/** What is missing from a checklist; `note` is the completion note (needed when an item is "no"). */
export function checkCompletionChecklist(
  checklist: Partial<Record<keyof CompletionChecklist, boolean | null>> | null | undefined,
  note: string | null | undefined,
): ChecklistCheck {
  const unanswered: (keyof CompletionChecklist)[] = [];
  const answeredNo: (keyof CompletionChecklist)[] = [];
  const errors: FieldError[] = [];
  for (const item of COMPLETION_CHECKLIST_ITEMS) {
    const answer = checklist?.[item.key];
    if (typeof answer !== 'boolean') {
      unanswered.push(item.key);
      errors.push({ field: `checklist.${item.key}`, message: `Answer "${item.label}".` });
    } else if (!answer) {
      answeredNo.push(item.key);
    }
  }
  if (answeredNo.length > 0 && !(note && note.trim().length > 0)) {
    errors.push({
      field: 'note',
      message: `Say in the note why these were not done: ${answeredNo
        .map((k) => COMPLETION_CHECKLIST_ITEMS.find((i) => i.key === k)!.label.toLowerCase())
        .join('; ')}.`,
    });
  }
  return { unanswered, answeredNo, errors };
}

/** Problems with a re-survey; empty when it can be stored. */
export function checkResurvey(points: readonly SurveyPointInput[] | null | undefined): FieldError[] {
  const errors: FieldError[] = [];
  if (!Array.isArray(points) || points.length < RESURVEY_MIN_POINTS) {
    return [
      {
        field: 'resurvey',
        message: `Re-survey at least ${RESURVEY_MIN_POINTS} points, one of them the reference point.`,
      },
    ];
  }
  if (points.length > SETTLEMENT_MAX_POINTS) {
    return [{ field: 'resurvey', message: `Give at most ${SETTLEMENT_MAX_POINTS} survey points.` }];
  }
  const seen = new Set<string>();
  const references: number[] = [];
  points.forEach((p, i) => {
    const at = `resurvey[${i}]`;
    const label = typeof p.label === 'string' ? p.label.trim() : '';
    if (label === '' || label.length > SURVEY_LABEL_MAX) {
      errors.push({
        field: `${at}.label`,
        message: `Give point ${i + 1} a label of 1 to ${SURVEY_LABEL_MAX} characters.`,
      });
    } else if (seen.has(label)) {
      errors.push({
        field: `${at}.label`,
        message: `The label "${label}" is used twice: labels must be unique.`,
      });
    } else seen.add(label);
    for (const [key, name] of [
      ['xFt', 'x (ft)'],
      ['yFt', 'y (ft)'],
      ['elevationIn', 'elevation (in)'],
    ] as const) {
      const parsed = parseStrictDecimal(p[key], { allowNegative: true, maxDecimals: 2, maxIntegerDigits: 6 });
      if (!parsed.ok)
        errors.push({ field: `${at}.${key}`, message: `Point ${i + 1}: ${name} ${parsed.message}.` });
    }
    if (p.isReference === true) references.push(i);
  });
  if (references.length !== 1) {
    errors.push({
      field: 'resurvey',
      message:
        references.length === 0
          ? 'Mark one point as the reference: every elevation is measured from it.'
          : 'Mark only one point as the reference.',
    });
  } else {
    const i = references[0]!;
    const parsed = parseStrictDecimal(points[i]!.elevationIn, { allowNegative: true, maxDecimals: 2 });
    if (parsed.ok && !parsed.value.isZero()) {
      errors.push({
        field: `resurvey[${i}].elevationIn`,
        message: 'The reference point reads 0: enter every other reading relative to it.',
      });
    }
  }
  return errors;
}
