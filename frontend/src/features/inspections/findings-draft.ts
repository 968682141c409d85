import {
  CRACK_WIDTH_PATTERN,
  FINDINGS_ITEMS,
  FINDINGS_LOCATION_MAX_LENGTH,
  FINDINGS_NOTE_MAX_LENGTH,
  type CrackFinding,
  type CrackOrientation,
  type FindingsItemKey,
  type FindingsPatch,
  type Grading,
  type GutterCoverage,
  type InspectionFindings,
  type LocationFinding,
  type ObservedFinding,
  type SoilMoisture,
  type SoilType,
} from '@loambook/common';

/*
 * The findings checklist as it is being filled in: every item may be unanswered (null, or a field not yet
 * chosen). An item is sent only once it is answered; an empty list is an answer ("none seen").
 */

export interface CrackDraft {
  key: string;
  location: string;
  widthIn: string;
  orientation: CrackOrientation | '';
  note: string;
}
export interface LocationDraft {
  key: string;
  location: string;
  note: string;
}
export interface ObservedDraft {
  observed: boolean | null;
  note: string;
}
export interface DrainageDraft {
  gutters: GutterCoverage | '';
  downspoutsDischargeNearFoundation: boolean | null;
  grading: Grading | '';
  note: string;
}
export interface SoilDraft {
  type: SoilType | '';
  moisture: SoilMoisture | '';
  note: string;
}

export type CrackKey = 'interiorCracks' | 'exteriorCracks';
export type ObservedKey = 'floorSlope' | 'erosion' | 'wallRotation' | 'plumbingLeaks';

export interface FindingsDraft {
  interiorCracks: CrackDraft[] | null;
  exteriorCracks: CrackDraft[] | null;
  doorsWindowsSticking: LocationDraft[] | null;
  floorSlope: ObservedDraft;
  erosion: ObservedDraft;
  drainage: DrainageDraft;
  wallRotation: ObservedDraft;
  plumbingLeaks: ObservedDraft;
  soil: SoilDraft;
}

let nextKey = 0;
/** A key for a list entry, so React keeps each entry's inputs while others are added or removed. */
export const entryKey = () => `e${++nextKey}`;

const observedDraft = (f: ObservedFinding | undefined): ObservedDraft => ({
  observed: f ? f.observed : null,
  note: f?.note ?? '',
});

export function draftFromFindings(f: Partial<InspectionFindings>): FindingsDraft {
  const cracks = (list: CrackFinding[] | undefined) =>
    list
      ? list.map((c) => ({
          key: entryKey(),
          location: c.location,
          widthIn: c.widthIn,
          orientation: c.orientation,
          note: c.note ?? '',
        }))
      : null;
  const locations = (list: LocationFinding[] | undefined) =>
    list ? list.map((l) => ({ key: entryKey(), location: l.location, note: l.note ?? '' })) : null;
  return {
    interiorCracks: cracks(f.interiorCracks),
    exteriorCracks: cracks(f.exteriorCracks),
    doorsWindowsSticking: locations(f.doorsWindowsSticking),
    floorSlope: observedDraft(f.floorSlope),
    erosion: observedDraft(f.erosion),
    drainage: {
      gutters: f.drainage?.gutters ?? '',
      downspoutsDischargeNearFoundation: f.drainage ? f.drainage.downspoutsDischargeNearFoundation : null,
      grading: f.drainage?.grading ?? '',
      note: f.drainage?.note ?? '',
    },
    wallRotation: observedDraft(f.wallRotation),
    plumbingLeaks: observedDraft(f.plumbingLeaks),
    soil: { type: f.soil?.type ?? '', moisture: f.soil?.moisture ?? '', note: f.soil?.note ?? '' },
  };
}

export function isAnswered(draft: FindingsDraft, key: FindingsItemKey): boolean {
  switch (key) {
    case 'interiorCracks':
    case 'exteriorCracks':
    case 'doorsWindowsSticking':
      return draft[key] !== null;
    case 'drainage':
      return (
        draft.drainage.gutters !== '' &&
        draft.drainage.grading !== '' &&
        draft.drainage.downspoutsDischargeNearFoundation !== null
      );
    case 'soil':
      return draft.soil.type !== '' && draft.soil.moisture !== '';
    default:
      return draft[key].observed !== null;
  }
}

/** The checklist items not answered yet, in checklist order. */
export function unanswered(draft: FindingsDraft): FindingsItemKey[] {
  return FINDINGS_ITEMS.map((i) => i.key).filter((k) => !isAnswered(draft, k));
}

/** Faults keyed as the server keys them: "interiorCracks.0.widthIn". */
export type DraftErrors = Record<string, string>;

export const WIDTH_MESSAGE = 'Inches as a decimal above 0, at most 4 decimals (1/16 in = 0.0625).';

export function validateDraft(draft: FindingsDraft): DraftErrors {
  const e: DraftErrors = {};
  const note = (path: string, value: string) => {
    if (value.trim().length > FINDINGS_NOTE_MAX_LENGTH)
      e[path] = `Use at most ${FINDINGS_NOTE_MAX_LENGTH} characters.`;
  };
  const location = (path: string, value: string, what: string) => {
    if (!value.trim()) e[path] = what;
    else if (value.trim().length > FINDINGS_LOCATION_MAX_LENGTH)
      e[path] = `Use at most ${FINDINGS_LOCATION_MAX_LENGTH} characters.`;
  };
  for (const key of ['interiorCracks', 'exteriorCracks'] as const) {
    draft[key]?.forEach((c, i) => {
      location(`${key}.${i}.location`, c.location, 'Say where the crack is.');
      if (!CRACK_WIDTH_PATTERN.test(c.widthIn.trim())) e[`${key}.${i}.widthIn`] = WIDTH_MESSAGE;
      if (!c.orientation) e[`${key}.${i}.orientation`] = 'Choose which way the crack runs.';
      note(`${key}.${i}.note`, c.note);
    });
  }
  draft.doorsWindowsSticking?.forEach((l, i) => {
    location(`doorsWindowsSticking.${i}.location`, l.location, 'Say which door or window.');
    note(`doorsWindowsSticking.${i}.note`, l.note);
  });
  for (const key of ['floorSlope', 'erosion', 'wallRotation', 'plumbingLeaks'] as const)
    note(`${key}.note`, draft[key].note);
  note('drainage.note', draft.drainage.note);
  note('soil.note', draft.soil.note);
  return e;
}

const withNote = <T extends object>(value: T, text: string): T & { note?: string } =>
  text.trim() ? { ...value, note: text.trim() } : value;

/** The answered items, as the PATCH sends them (an item sent replaces the stored one whole). */
export function toFindingsPatch(draft: FindingsDraft): FindingsPatch {
  const patch: FindingsPatch = {};
  for (const key of ['interiorCracks', 'exteriorCracks'] as const) {
    const list = draft[key];
    if (list)
      patch[key] = list.map((c) =>
        withNote(
          {
            location: c.location.trim(),
            widthIn: c.widthIn.trim(),
            orientation: c.orientation as CrackOrientation,
          },
          c.note,
        ),
      );
  }
  if (draft.doorsWindowsSticking)
    patch.doorsWindowsSticking = draft.doorsWindowsSticking.map((l) =>
      withNote({ location: l.location.trim() }, l.note),
    );
  for (const key of ['floorSlope', 'erosion', 'wallRotation', 'plumbingLeaks'] as const) {
    const d = draft[key];
    if (d.observed !== null) patch[key] = withNote({ observed: d.observed }, d.note);
  }
  if (isAnswered(draft, 'drainage')) {
    const d = draft.drainage;
    patch.drainage = withNote(
      {
        gutters: d.gutters as GutterCoverage,
        downspoutsDischargeNearFoundation: d.downspoutsDischargeNearFoundation as boolean,
        grading: d.grading as Grading,
      },
      d.note,
    );
  }
  if (isAnswered(draft, 'soil')) {
    patch.soil = withNote(
      { type: draft.soil.type as SoilType, moisture: draft.soil.moisture as SoilMoisture },
      draft.soil.note,
    );
  }
  return patch;
}

/** Whether the draft says something other than what is stored. */
export function draftDiffers(draft: FindingsDraft, stored: Partial<InspectionFindings>): boolean {
  return (
    JSON.stringify(toFindingsPatch(draft)) !== JSON.stringify(toFindingsPatch(draftFromFindings(stored))) ||
    // A half-answered drainage or soil item is a change too, though it is not sent yet.
    unanswered(draft).length !== unanswered(draftFromFindings(stored)).length ||
    hasPartial(draft)
  );
}

function hasPartial(draft: FindingsDraft): boolean {
  const d = draft.drainage;
  const s = draft.soil;
  const drainageTouched =
    d.gutters !== '' || d.grading !== '' || d.downspoutsDischargeNearFoundation !== null;
  const soilTouched = s.type !== '' || s.moisture !== '';
  return (drainageTouched && !isAnswered(draft, 'drainage')) || (soilTouched && !isAnswered(draft, 'soil'));
}

export const ITEM_LABEL: Record<FindingsItemKey, string> = Object.fromEntries(
  FINDINGS_ITEMS.map((i) => [i.key, i.label]),
) as Record<FindingsItemKey, string>;
