import { describe, expect, it } from 'vitest';
import { DEFAULT_KT_PER_FT } from '../calculators/helical-capacity';
import { checkInstallEntry, installLogTotals, type InstallEntryCheck } from './install-log';

const fields = (c: InstallEntryCheck) => (c.ok ? [] : c.errors.map((e) => e.field));

describe('checkInstallEntry: helical piles, capacity from torque', () => {
  it.each([
    // shaft, torque ft·lb, design load lb → Qu, allowable, below design load
    // Qu = Kt × T (Hoyt & Clemence 1989, secondary); Kt 10 ft⁻¹ for a 1.5 in square shaft (ICC-ES AC358
    // defaults, secondary); allowable = Qu / 2 (IBC 1810.3.3.1.9 "Pa = 0.5 Pu", memory).
    // 10 × 3,000 = 30,000 lb; / 2 = 15,000 lb < 18,000 lb → flagged.
    ['1.5in-square', '3000', '18000', '30000.00', '15000.00', true],
    // REFERENCE-VALUES.md example: 1.5 in square, T = 6,500 ft·lb → Qu 65,000 lb, allowable 32,500 lb;
    // allowable equal to the design load meets it.
    ['1.5in-square', '6500', '32500', '65000.00', '32500.00', false],
    ['1.5in-square', '6499', '32500', '64990.00', '32495.00', true],
    // Kt 7 ft⁻¹ for 3.5 in round (ICC-ES AC358 defaults, secondary): 7 × 4,000 = 28,000; / 2 = 14,000.
    ['3.5in-round', '4000', '12000', '28000.00', '14000.00', false],
    // Kt 9 ft⁻¹ for 2.875 in round (same source): 9 × 5,000 = 45,000; / 2 = 22,500 < 22,500.01.
    ['2.875in-round', '5000', '22500.01', '45000.00', '22500.00', true],
    // 7 × 3,333.33 = 23,333.31; / 2 = 11,666.655: stored cut down to 11,666.65; the flag uses the exact
    // figure, so a design load of 11,666.65 is met and 11,666.66 is not.
    ['3.5in-round', '3333.33', '11666.65', '23333.31', '11666.65', false],
    ['3.5in-round', '3333.33', '11666.66', '23333.31', '11666.65', true],
  ] as const)(
    '%s at %s ft·lb carrying %s lb → Qu %s, allowable %s, flagged %s',
    (shaft, torque, design, qu, pa, below) => {
      const c = checkInstallEntry({
        kind: 'helical_pile',
        number: 1,
        depthFt: '21.5',
        torqueFtLb: torque,
        shaft,
        designLoadLb: design,
      });
      expect(c.ok).toBe(true);
      if (!c.ok) return;
      expect(c.entry.capacityUltimateLb).toBe(qu);
      expect(c.entry.capacityAllowableLb).toBe(pa);
      expect(c.entry.belowDesignLoad).toBe(below);
      expect(c.entry.ktPerFt).toBe(DEFAULT_KT_PER_FT[shaft]);
    },
  );

  it('needs the torque, the shaft, the design load and the depth; no pressure or pounds', () => {
    expect(fields(checkInstallEntry({ kind: 'helical_pile', number: 2 }))).toEqual([
      'depthFt',
      'torqueFtLb',
      'designLoadLb',
      'shaft',
    ]);
    const c = checkInstallEntry({
      kind: 'helical_pile',
      number: 2,
      depthFt: '20',
      torqueFtLb: '0',
      shaft: '4in-square' as never,
      designLoadLb: '15000',
      finalPressurePsi: '3000',
      pounds: '10',
    });
    expect(fields(c).sort()).toEqual(['finalPressurePsi', 'pounds', 'shaft', 'torqueFtLb']);
  });
});

describe('checkInstallEntry: injection points and push piers', () => {
  const point = {
    kind: 'injection' as const,
    number: 3,
    pounds: '22.5',
    stopReason: 'surface_return' as const,
  };

  it('an injection point needs its pounds and why it stopped', () => {
    const c = checkInstallEntry(point);
    expect(c.ok).toBe(true);
    if (c.ok) {
      expect(c.entry.pounds).toBe('22.5');
      expect(c.entry.depthFt).toBeNull();
      expect(c.entry.belowDesignLoad).toBeNull();
    }
    expect(fields(checkInstallEntry({ kind: 'injection', number: 3 }))).toEqual(['pounds', 'stopReason']);
  });

  it.each([
    [{ stopReason: 'other' }, ['note']],
    [{ stopReason: 'other', note: '   ' }, ['note']],
    [{ stopReason: 'other', note: 'Hit a buried slab edge' }, []],
    [{ stopReason: 'lift_observed' }, []],
    [{ stopReason: 'lifted' }, ['stopReason']],
    [{ pounds: '-1' }, ['pounds']],
    [{ pounds: 22.5 }, ['pounds']], // a number may already have lost digits: strings only
    [{ pounds: '22.555' }, ['pounds']],
    [{ torqueFtLb: '3000' }, ['torqueFtLb']],
    [{ finalPressurePsi: '2500', shaft: '1.5in-square' }, ['finalPressurePsi', 'shaft']],
    [{ number: 0 }, ['number']],
    [{ number: 10000 }, ['number']],
    [{ number: 1.5 }, ['number']],
    [{ depthFt: '200.01' }, ['depthFt']],
    [{ location: 'x'.repeat(121) }, ['location']],
  ] as [Record<string, unknown>, string[]][])('injection with %j → faults %j', (patch, expected) => {
    expect(fields(checkInstallEntry({ ...point, ...patch } as never)).sort()).toEqual(expected.sort());
  });

  it('a push pier needs its depth and final pressure; the design load is optional', () => {
    const ok = checkInstallEntry({ kind: 'push_pier', number: 1, depthFt: '18', finalPressurePsi: '4200' });
    expect(ok.ok).toBe(true);
    if (ok.ok) expect(ok.entry.capacityAllowableLb).toBeNull();
    expect(fields(checkInstallEntry({ kind: 'push_pier', number: 1 }))).toEqual([
      'depthFt',
      'finalPressurePsi',
    ]);
    expect(
      fields(
        checkInstallEntry({
          kind: 'push_pier',
          number: 1,
          depthFt: '18',
          finalPressurePsi: '4200',
          torqueFtLb: '3000',
          stopReason: 'other',
        }),
      ).sort(),
    ).toEqual(['stopReason', 'torqueFtLb']);
  });

  it('refuses an unknown kind', () => {
    expect(fields(checkInstallEntry({ kind: 'anchor' as never, number: 1 }))).toEqual(['kind']);
  });
});

describe('installLogTotals', () => {
  it('counts rows by kind, sums the pounds exactly and counts the flagged rows', () => {
    expect(
      installLogTotals([
        { kind: 'injection', pounds: '20.10', belowDesignLoad: null },
        { kind: 'injection', pounds: '0.20', belowDesignLoad: null },
        { kind: 'push_pier', pounds: null, belowDesignLoad: null },
        { kind: 'helical_pile', pounds: null, belowDesignLoad: true },
        { kind: 'helical_pile', pounds: null, belowDesignLoad: false },
      ]),
    ).toEqual({ injectionPoints: 2, pounds: '20.30', pushPiers: 1, helicalPiles: 2, flagged: 1 });
    expect(installLogTotals([])).toEqual({
      injectionPoints: 0,
      pounds: '0.00',
      pushPiers: 0,
      helicalPiles: 0,
      flagged: 0,
    });
  });
});
