import { describe, expect, it } from 'vitest';
import type { HelicalShaft, JobPlanLine } from '@loambook/common';
import type { LogRow } from './log-rows';
import { defaultShaft, planShaft, shaftsNamedIn } from './shaft-default';

// The four shafts of common's helical calculator (ICC-ES AC358 default Kt by shaft, secondary), as a
// price book might write them.
describe('the shafts a plan line names', () => {
  it.each<[string, HelicalShaft[]]>([
    ['Helical pile, 1.5 in square shaft', ['1.5in-square']],
    ['Helical pile, 1-1/2" square bar, with bracket', ['1.5in-square']],
    ['Helical pile 1½″ SQ shaft', ['1.5in-square']],
    ['Helical pile, 1-3/4 in square shaft', ['1.75in-square']],
    ['Helical pile, 2-7/8" round pipe', ['2.875in-round']],
    ['Helical pile, 2⅞ in round shaft', ['2.875in-round']],
    ['Helical pile, 2.875 inch round', ['2.875in-round']],
    ['Helical pile, 3-1/2 in round shaft', ['3.5in-round']],
    ['Helical pile, 3 1/2 inch pipe shaft', ['3.5in-round']],
    ['Helical pile, installed to torque, with bracket', []],
    // A size no shaft of the calculator has: nothing (never the nearest one).
    ['Helical pile, 2 in square shaft', []],
    ['Helical pile, 1.5 in square or 2-7/8 in round shaft', ['1.5in-square', '2.875in-round']],
  ])('%s', (text, shafts) => {
    expect(shaftsNamedIn(text)).toEqual(shafts);
  });
});

const line = (description: string, category = 'helical_piles'): JobPlanLine => ({
  code: 'HP',
  description,
  category,
  unit: 'each',
  quantity: '4',
  unitCost: '900.00',
  unitPrice: '2000.00',
});

const pile = (number: number, shaft: HelicalShaft): LogRow =>
  ({ kind: 'helical_pile', number, shaft }) as LogRow;

describe('the shaft a new pile starts on', () => {
  it('is the plan’s when its helical lines name exactly one', () => {
    expect(planShaft([line('Helical pile, 1.5 in square shaft')])).toBe('1.5in-square');
    expect(
      planShaft([line('Helical pile, 1.5 in square shaft'), line('Helical pile, 3-1/2 in round shaft')]),
    ).toBeNull();
    // A line that is not a helical pile does not count.
    expect(planShaft([line('Steel push pier, 2-7/8 in round tube', 'piers')])).toBeNull();
  });

  it('follows the last pile logged (rows newest first), then the plan, else none', () => {
    const plan = [line('Helical pile, 2-7/8 in round shaft')];
    expect(defaultShaft([pile(3, '1.5in-square'), pile(2, '2.875in-round')], plan)).toEqual({
      shaft: '1.5in-square',
      from: 'As pile 3, the last one logged.',
    });
    expect(defaultShaft([], plan)?.shaft).toBe('2.875in-round');
    expect(defaultShaft([], [line('Helical pile, installed to torque')])).toBeNull();
  });
});
