import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Decimal from 'decimal.js';
import { DEFAULT_KT_PER_FT, helicalCapacity } from './helical-capacity';
import { CalculatorInputError } from './errors';

describe('helicalCapacity', () => {
  it.each([
    // Default Kt per shaft: ICC-ES AC358 (secondary)
    ['1.5in-square', '10'],
    ['1.75in-square', '10'],
    ['2.875in-round', '9'],
    ['3.5in-round', '7'],
  ] as const)('default Kt for %s is %s ft⁻¹ (ICC-ES AC358 defaults, secondary)', (shaft, kt) => {
    expect(DEFAULT_KT_PER_FT[shaft]).toBe(kt);
    expect(helicalCapacity({ shaft, torqueFtLb: '1000' }).kt).toBe(kt);
  });

  it.each([
    // shaft, torque, ultimate, allowable
    // 1.5 in square, T = 6,500 ft·lb → Qu 65,000 lb, allowable 32,500 lb:
    // Qu = Kt·T (Hoyt & Clemence 1989, secondary); FS 2 (IBC 1810.3.3.1.9, memory); REFERENCE-VALUES.md example
    ['1.5in-square', '6500', '65000', '32500'],
    ['1.75in-square', '4000', '40000', '20000'], // arithmetic from the same rules
    ['2.875in-round', '5000', '45000', '22500'], // arithmetic from the same rules
    ['3.5in-round', '4000', '28000', '14000'], // arithmetic from the same rules
    ['3.5in-round', '3333.33', '23333.31', '11666.655'], // no rounding of the capacity
  ] as const)('%s at %s ft·lb → Qu %s lb, allowable %s lb', (shaft, torqueFtLb, ultimateLb, allowableLb) => {
    const result = helicalCapacity({ shaft, torqueFtLb });
    expect(result.ultimateLb).toBe(ultimateLb);
    expect(result.allowableLb).toBe(allowableLb);
    expect(result.requiredTorqueFtLb).toBeUndefined();
    expect(result.meetsDesignLoad).toBeUndefined();
  });

  it.each([
    // shaft, design load, required torque (2·P/Kt rounded up to a whole ft·lb)
    ['1.5in-square', '32500', '6500'], // the REFERENCE-VALUES.md example read backwards
    ['3.5in-round', '20000', '5715'], // 5714.28… rounds up
    ['2.875in-round', '9000', '2000'], // exact, no rounding up
    ['2.875in-round', '9000.01', '2001'], // a cent over rounds up
  ] as const)('%s carrying %s lb needs %s ft·lb', (shaft, designLoadLb, requiredTorqueFtLb) => {
    expect(helicalCapacity({ shaft, designLoadLb }).requiredTorqueFtLb).toBe(requiredTorqueFtLb);
  });

  it.each([
    ['6500', '32500', true], // allowable equals design load: meets it
    ['6499', '32500', false],
    ['7000', '32500', true],
  ])('1.5 in square at %s ft·lb carrying %s lb: meets = %s', (torqueFtLb, designLoadLb, meets) => {
    expect(helicalCapacity({ shaft: '1.5in-square', torqueFtLb, designLoadLb }).meetsDesignLoad).toBe(meets);
  });

  it('uses a Kt given by the engineer or manufacturer instead of the default', () => {
    const result = helicalCapacity({ shaft: '3.5in-round', torqueFtLb: '4000', ktPerFt: '8' });
    expect(result.kt).toBe('8');
    expect(result.ultimateLb).toBe('32000');
    expect(result.ktSource).toContain('given');
  });

  it('names its sources and defers to the engineer of record', () => {
    const result = helicalCapacity({ shaft: '1.5in-square', torqueFtLb: '6500' });
    expect(result.sources.join(' ')).toContain('Hoyt & Clemence');
    expect(result.sources.join(' ')).toContain('AC358');
    expect(result.cautions.join(' ')).toContain('engineer of record');
  });

  it.each([
    [{ shaft: '2in-square', torqueFtLb: '1000' }, 'shaft'],
    [{ shaft: '1.5in-square' }, 'torqueFtLb'],
    [{ shaft: '1.5in-square', torqueFtLb: '0' }, 'torqueFtLb'],
    [{ shaft: '1.5in-square', torqueFtLb: 6500 }, 'torqueFtLb'],
    [{ shaft: '1.5in-square', designLoadLb: '-1' }, 'designLoadLb'],
    [{ shaft: '1.5in-square', torqueFtLb: '1000', ktPerFt: '500' }, 'ktPerFt'],
  ])('refuses %j', (input, field) => {
    try {
      helicalCapacity(input as never);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CalculatorInputError);
      expect((error as CalculatorInputError).details.map((d) => d.field)).toContain(field);
    }
  });

  it('the required torque always gives an allowable capacity at least the design load, and 1 ft·lb less does not', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('1.5in-square', '1.75in-square', '2.875in-round', '3.5in-round' as const),
        fc.integer({ min: 1, max: 20_000_000 }),
        (shaft, cents) => {
          const designLoadLb = new Decimal(cents).div(100).toFixed();
          const required = helicalCapacity({ shaft, designLoadLb }).requiredTorqueFtLb ?? '';
          const at = helicalCapacity({ shaft, torqueFtLb: required, designLoadLb }).meetsDesignLoad;
          const below = new Decimal(required).minus(1);
          const under =
            below.lte(0) ||
            !helicalCapacity({ shaft, torqueFtLb: below.toFixed(), designLoadLb }).meetsDesignLoad;
          return at === true && under;
        },
      ),
    );
  });
});
