// Helical pile capacity from the final installation torque: a screening figure.
//
//   Qu = Kt × T            (Hoyt & Clemence 1989, secondary)
//   allowable = Qu / 2     (factor of safety 2; IBC 1810.3.3.1.9 "Pa = 0.5 Pu", memory)
//   required T = 2 × design load / Kt, rounded UP to a whole ft·lb (rounding up never under-states it)
import { CAUTION_CALL_811, CAUTION_ENGINEER } from './cautions';
import { CalcDecimal, CalcDecimalValue, ceilDivide, formatCalcDecimal } from './decimal';
import { InputCollector, requireInputObject } from './input';

export const HELICAL_SHAFTS = ['1.5in-square', '1.75in-square', '2.875in-round', '3.5in-round'] as const;
export type HelicalShaft = (typeof HELICAL_SHAFTS)[number];

/** Default torque correlation factors Kt, ft⁻¹ (ICC-ES AC358 defaults, secondary). */
export const DEFAULT_KT_PER_FT: Readonly<Record<HelicalShaft, string>> = {
  '1.5in-square': '10',
  '1.75in-square': '10',
  '2.875in-round': '9',
  '3.5in-round': '7',
};

export const HELICAL_FACTOR_OF_SAFETY = '2';

export const HELICAL_SOURCES = [
  'Qu = Kt × T: Hoyt & Clemence (1989) (secondary)',
  'Default Kt by shaft: ICC-ES AC358 (secondary)',
  'Allowable = Qu / 2: IBC 1810.3.3.1.9 "Pa = 0.5 Pu" (memory)',
] as const;

export interface HelicalCapacityInput {
  shaft: HelicalShaft;
  /** Final installation torque, ft·lb. */
  torqueFtLb?: string;
  /** Design (service) load the pile must carry, lb. */
  designLoadLb?: string;
  /**
   * A Kt to use instead of the AC358 default, ft⁻¹, for example from the manufacturer's evaluation
   * report or the engineer of record. Optional.
   */
  ktPerFt?: string;
}

export interface HelicalCapacityResult {
  shaft: HelicalShaft;
  /** Kt used, ft⁻¹. */
  kt: string;
  ktSource: string;
  factorOfSafety: string;
  /** Present when torqueFtLb is given. */
  ultimateLb?: string;
  allowableLb?: string;
  /** Present when designLoadLb is given: whole ft·lb, rounded up. */
  requiredTorqueFtLb?: string;
  /** Present when both are given: allowable ≥ design load. */
  meetsDesignLoad?: boolean;
  sources: string[];
  cautions: string[];
}

export function helicalCapacity(input: HelicalCapacityInput): HelicalCapacityResult {
  const fields = requireInputObject(input, 'The helical capacity check');
  const v = new InputCollector();
  const shaft = fields.shaft;
  const shaftKnown = typeof shaft === 'string' && (HELICAL_SHAFTS as readonly string[]).includes(shaft);
  if (!shaftKnown) {
    v.add('shaft', `Shaft must be one of ${HELICAL_SHAFTS.join(', ')}.`);
  }
  const torque = v.optionalDecimal('torqueFtLb', 'Installation torque (ft·lb)', fields.torqueFtLb, {
    positive: true,
    maxDecimals: 2,
  });
  const designLoad = v.optionalDecimal('designLoadLb', 'Design load (lb)', fields.designLoadLb, {
    positive: true,
    maxDecimals: 2,
  });
  const ktOverride = v.optionalDecimal('ktPerFt', 'Kt (per ft)', fields.ktPerFt, {
    positive: true,
    maxDecimals: 4,
    max: { value: '100', why: 'Kt is in ft⁻¹; values are usually under 20' },
  });
  if (fields.torqueFtLb === undefined && fields.designLoadLb === undefined) {
    v.add('torqueFtLb', 'Give the installation torque, the design load, or both.');
  }
  v.throwIfAny();
  const shaftName = shaft as HelicalShaft;

  const kt: CalcDecimalValue = ktOverride ?? new CalcDecimal(DEFAULT_KT_PER_FT[shaftName]);
  const fs = new CalcDecimal(HELICAL_FACTOR_OF_SAFETY);
  const result: HelicalCapacityResult = {
    shaft: shaftName,
    kt: formatCalcDecimal(kt),
    ktSource: ktOverride ? 'given with the input' : 'ICC-ES AC358 default for this shaft (secondary)',
    factorOfSafety: HELICAL_FACTOR_OF_SAFETY,
    sources: [...HELICAL_SOURCES],
    cautions: [
      "Torque correlation gives a screening figure; load tests, the manufacturer's evaluation report and the engineer of " +
        'record govern the capacity used in design.',
      CAUTION_CALL_811,
      CAUTION_ENGINEER,
    ],
  };
  let allowable: CalcDecimalValue | undefined;
  if (torque) {
    const ultimate = kt.mul(torque);
    allowable = ultimate.div(fs);
    result.ultimateLb = formatCalcDecimal(ultimate);
    result.allowableLb = formatCalcDecimal(allowable);
  }
  if (designLoad) {
    result.requiredTorqueFtLb = formatCalcDecimal(ceilDivide(fs.mul(designLoad), kt));
    if (allowable) result.meetsDesignLoad = allowable.gte(designLoad);
  }
  return result;
}
