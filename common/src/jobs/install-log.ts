// The crew's install log: what one row must carry, per kind of work, and the log's totals.
//
// Injection point (polyurethane soil stabilisation): pounds pumped and why the point stopped (material
// back at the surface, lift observed, planned quantity reached, or another reason explained in a note;
// REFERENCE-VALUES.md "Polyurethane soil-stabilisation injection", common practice).
// Push pier: depth reached and the final hydraulic pressure.
// Helical pile: depth reached, final installation torque, shaft and the design load; the capacity is
// computed from the torque with the calculator of #3 (helicalCapacity):
//   Qu = Kt × T (Hoyt & Clemence 1989, secondary), Kt by shaft per ICC-ES AC358 defaults (secondary),
//   allowable = Qu / 2 (IBC 1810.3.3.1.9 "Pa = 0.5 Pu", memory).
// An allowable capacity below the design load flags the row (belowDesignLoad). The flag is decided on the
// exact figures; the stored capacities are then cut to cents DOWNWARDS (numeric(14,2)), so a stored figure
// never shows more capacity than the torque gave. A screening figure: the engineer of record decides.
import type { FieldError } from '../api/types';
import {
  CalcDecimal,
  type CalcDecimalValue,
  formatCalcDecimal,
  parseStrictDecimal,
} from '../calculators/decimal';
import { HELICAL_SHAFTS, helicalCapacity, type HelicalShaft } from '../calculators/helical-capacity';
import type { InstallEntryInput, InstallKind, StopReason } from './api-types';

export const INSTALL_KINDS: readonly InstallKind[] = ['injection', 'push_pier', 'helical_pile'];
export const STOP_REASONS: readonly StopReason[] = [
  'surface_return',
  'lift_observed',
  'planned_quantity',
  'other',
];

export const INSTALL_KIND_LABELS: Record<InstallKind, string> = {
  injection: 'Injection point',
  push_pier: 'Push pier',
  helical_pile: 'Helical pile',
};

export const STOP_REASON_LABELS: Record<StopReason, string> = {
  surface_return: 'Material returned to the surface',
  lift_observed: 'Lift observed',
  planned_quantity: 'Planned quantity reached',
  other: 'Another reason (see the note)',
};

/** Limits of the install_entries columns (jobs migration). */
export const INSTALL_LIMITS = {
  number: { min: 1, max: 9999 },
  locationMaxLength: 120,
  noteMaxLength: 2000,
  depthFtMax: '200',
} as const;

/** The row as it will be stored: every decimal a plain string, absent values null. */
export interface CheckedInstallEntry {
  kind: InstallKind;
  number: number;
  location: string | null;
  locationFt: string | null;
  depthFt: string | null;
  pounds: string | null;
  stopReason: StopReason | null;
  finalPressurePsi: string | null;
  torqueFtLb: string | null;
  shaft: HelicalShaft | null;
  designLoadLb: string | null;
  note: string | null;
  /** Helical piles only. */
  capacityUltimateLb: string | null;
  capacityAllowableLb: string | null;
  belowDesignLoad: boolean | null;
  /** Kt used, ft⁻¹ (helical piles only). */
  ktPerFt: string | null;
}

export type InstallEntryCheck =
  { ok: true; entry: CheckedInstallEntry } | { ok: false; errors: FieldError[] };

type EntryFields = Omit<InstallEntryInput, 'clientRowId' | 'loggedAt'>;

const present = (v: unknown) => v !== undefined && v !== null && !(typeof v === 'string' && v.trim() === '');

/** Checks one log row for its kind; lists every fault at once. */
export function checkInstallEntry(input: EntryFields): InstallEntryCheck {
  const errors: FieldError[] = [];
  const add = (field: string, message: string) => errors.push({ field, message });

  const decimal = (
    field: keyof EntryFields,
    label: string,
    // digits: most digits before the point, as the column allows (numeric(p,2) → p − 2).
    opts: { digits: number; required?: boolean; positive?: boolean; max?: string },
  ): CalcDecimalValue | null => {
    const value = input[field];
    if (!present(value)) {
      if (opts.required) add(field, `${label} is required.`);
      return null;
    }
    const parsed = parseStrictDecimal(value, { maxDecimals: 2, maxIntegerDigits: opts.digits });
    if (!parsed.ok) {
      add(field, `${label} ${parsed.message}.`);
      return null;
    }
    if (opts.positive && parsed.value.lte(0)) {
      add(field, `${label} must be greater than 0.`);
      return null;
    }
    if (opts.max && parsed.value.gt(opts.max)) {
      add(field, `${label} must not be more than ${opts.max}.`);
      return null;
    }
    return parsed.value;
  };
  /** A field that belongs to another kind of row: refused, so that a typo never lands in the record. */
  const notFor = (field: keyof EntryFields, label: string, kindLabel: string) => {
    if (present(input[field])) add(field, `${label} is not recorded for a ${kindLabel.toLowerCase()}.`);
  };

  const kind = input.kind;
  if (!INSTALL_KINDS.includes(kind)) {
    add('kind', `Kind must be one of ${INSTALL_KINDS.join(', ')}.`);
    return { ok: false, errors };
  }
  const kindLabel = INSTALL_KIND_LABELS[kind];
  const number = input.number;
  if (
    typeof number !== 'number' ||
    !Number.isInteger(number) ||
    number < INSTALL_LIMITS.number.min ||
    number > INSTALL_LIMITS.number.max
  ) {
    add('number', `The ${kind === 'injection' ? 'point' : 'pier'} number is a whole number from 1 to 9999.`);
  }
  const location = present(input.location) ? String(input.location).trim() : null;
  if (location && location.length > INSTALL_LIMITS.locationMaxLength) {
    add('location', `The location is at most ${INSTALL_LIMITS.locationMaxLength} characters.`);
  }
  const note = present(input.note) ? String(input.note).trim() : null;
  if (note && note.length > INSTALL_LIMITS.noteMaxLength) {
    add('note', `The note is at most ${INSTALL_LIMITS.noteMaxLength} characters.`);
  }
  const locationFt = decimal('locationFt', 'Location along the wall (ft)', { digits: 6 });
  const depthFt = decimal('depthFt', 'Depth reached (ft)', {
    digits: 6,
    required: kind !== 'injection',
    max: INSTALL_LIMITS.depthFtMax,
  });

  let pounds: CalcDecimalValue | null = null;
  let stopReason: StopReason | null = null;
  let finalPressure: CalcDecimalValue | null = null;
  let torque: CalcDecimalValue | null = null;
  let shaft: HelicalShaft | null = null;
  let designLoad: CalcDecimalValue | null = null;

  if (kind === 'injection') {
    pounds = decimal('pounds', 'Pounds pumped', { digits: 8, required: true });
    if (!present(input.stopReason)) {
      add('stopReason', 'Say why the point stopped.');
    } else if (!STOP_REASONS.includes(input.stopReason as StopReason)) {
      add('stopReason', `Why it stopped must be one of ${STOP_REASONS.join(', ')}.`);
    } else {
      stopReason = input.stopReason as StopReason;
      if (stopReason === 'other' && !note) add('note', 'Another reason: write it in the note.');
    }
    notFor('finalPressurePsi', 'Final hydraulic pressure', kindLabel);
    notFor('torqueFtLb', 'Installation torque', kindLabel);
    notFor('shaft', 'The shaft', kindLabel);
    notFor('designLoadLb', 'The design load', kindLabel);
  } else {
    notFor('pounds', 'Pounds of material', kindLabel);
    notFor('stopReason', 'A stop reason', kindLabel);
    if (kind === 'push_pier') {
      finalPressure = decimal('finalPressurePsi', 'Final hydraulic pressure (psi)', {
        digits: 8,
        required: true,
        positive: true,
      });
      notFor('torqueFtLb', 'Installation torque', kindLabel);
      notFor('shaft', 'The shaft', kindLabel);
      designLoad = decimal('designLoadLb', 'Design load (lb)', { digits: 12, positive: true });
    } else {
      notFor('finalPressurePsi', 'Final hydraulic pressure', kindLabel);
      torque = decimal('torqueFtLb', 'Final installation torque (ft·lb)', {
        digits: 10,
        required: true,
        positive: true,
      });
      designLoad = decimal('designLoadLb', 'Design load (lb)', {
        digits: 12,
        required: true,
        positive: true,
      });
      if (!present(input.shaft)) add('shaft', 'Choose the shaft.');
      else if (!(HELICAL_SHAFTS as readonly string[]).includes(input.shaft as string)) {
        add('shaft', `The shaft must be one of ${HELICAL_SHAFTS.join(', ')}.`);
      } else shaft = input.shaft as HelicalShaft;
    }
  }
  if (errors.length > 0) return { ok: false, errors };

  const entry: CheckedInstallEntry = {
    kind,
    number,
    location,
    locationFt: text(locationFt),
    depthFt: text(depthFt),
    pounds: text(pounds),
    stopReason,
    finalPressurePsi: text(finalPressure),
    torqueFtLb: text(torque),
    shaft,
    designLoadLb: text(designLoad),
    note,
    capacityUltimateLb: null,
    capacityAllowableLb: null,
    belowDesignLoad: null,
    ktPerFt: null,
  };
  if (kind === 'helical_pile' && shaft && torque && designLoad) {
    const capacity = helicalCapacity({
      shaft,
      torqueFtLb: formatCalcDecimal(torque),
      designLoadLb: formatCalcDecimal(designLoad),
    });
    entry.capacityUltimateLb = centsDown(capacity.ultimateLb!);
    entry.capacityAllowableLb = centsDown(capacity.allowableLb!);
    entry.belowDesignLoad = capacity.meetsDesignLoad === false;
    entry.ktPerFt = capacity.kt;
  }
  return { ok: true, entry };
}

const text = (v: CalcDecimalValue | null) => (v === null ? null : formatCalcDecimal(v));

/** Two decimals, cut towards zero: a capacity is never shown larger than computed. */
function centsDown(value: string): string {
  return new CalcDecimal(value).toDecimalPlaces(2, CalcDecimal.ROUND_DOWN).toFixed(2);
}

export interface InstallLogTotals {
  injectionPoints: number;
  pounds: string;
  pushPiers: number;
  helicalPiles: number;
  flagged: number;
}

/** Counts per kind, the pounds pumped (exact sum, 2 decimals) and the rows flagged below design load. */
export function installLogTotals(
  entries: readonly { kind: InstallKind; pounds: string | null; belowDesignLoad: boolean | null }[],
): InstallLogTotals {
  let pounds = new CalcDecimal(0);
  const totals = { injectionPoints: 0, pushPiers: 0, helicalPiles: 0, flagged: 0 };
  for (const e of entries) {
    if (e.kind === 'injection') totals.injectionPoints++;
    else if (e.kind === 'push_pier') totals.pushPiers++;
    else totals.helicalPiles++;
    if (e.pounds !== null) pounds = pounds.plus(e.pounds);
    if (e.belowDesignLoad) totals.flagged++;
  }
  return { ...totals, pounds: pounds.toFixed(2) };
}
