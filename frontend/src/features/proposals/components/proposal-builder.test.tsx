import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { ProposalDetail } from '@loambook/common';
import { ApiError } from '@/lib/api-client';
import { fakeApi } from '@/testing/fake-api';
import { makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { draftFromProposal } from '../proposal-draft';
import { ITEMS, makeOption, makeProposal } from '../testing/fixtures';
import { ProposalBuilder } from './proposal-builder';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function renderBuilder(
  saved: ProposalDetail = makeProposal(),
  handlers: { onSave?: () => Promise<unknown>; onSubmit?: () => Promise<unknown> } = {},
) {
  signInAs(makeUser('salesperson'));
  const onSave = vi.fn(handlers.onSave ?? (async () => undefined));
  const onSubmit = vi.fn(handlers.onSubmit ?? (async () => undefined));
  renderApp(
    <ProposalBuilder
      initial={draftFromProposal(saved)}
      saved={saved}
      items={Object.values(ITEMS)}
      branch={makeBranch()}
      viewer={{ role: 'salesperson', isSalesperson: true }}
      inspections={[]}
      mode="edit"
      canSubmit
      pending={null}
      onSave={onSave}
      onSubmit={onSubmit}
    />,
  );
  return { onSave, onSubmit };
}

const figures = () => screen.getByRole('region', { name: 'Figures' });

describe('proposal builder', () => {
  it('shows the option’s figures as the API computed them, formatted as money', async () => {
    fakeApi({});
    renderBuilder();
    const panel = await screen.findByRole('region', { name: 'Figures' });
    expect(within(panel).getByText('As saved')).toBeInTheDocument();
    expect(within(panel).getByText('$1,398.00')).toBeInTheDocument();
    expect(within(panel).getByText('$3,075.00')).toBeInTheDocument();
    expect(within(panel).getByText('−$307.50 (10.00%)')).toBeInTheDocument();
    // Net and customer total are the same here: the branch pays the tax on its materials.
    expect(within(panel).getAllByText('$2,767.50')).toHaveLength(2);
    expect(within(panel).getByText('$65.88')).toBeInTheDocument();
    expect(within(panel).getByText('6% on materials, paid by the branch')).toBeInTheDocument();
    expect(within(panel).getByText('47.10%')).toBeInTheDocument();
    expect(within(panel).getByText('93.25%')).toBeInTheDocument();
    expect(within(panel).getByText(/Your commission at 8%/)).toHaveTextContent('$221.40');
  });

  it('says in words why the option needs approval, with the limits it is measured against', async () => {
    fakeApi({});
    renderBuilder(
      makeProposal({
        options: [
          makeOption({
            approval: {
              needsApproval: true,
              approver: 'branch_manager',
              reasons: ['MARGIN_BELOW_FLOOR', 'DISCOUNT_BEYOND_AUTHORITY'],
            },
          }),
        ],
      }),
    );
    const panel = await screen.findByRole('region', { name: 'Figures' });
    expect(within(panel).getByText('Needs the branch manager’s approval')).toBeInTheDocument();
    expect(within(panel).getByText('Margin below the branch floor (38%)')).toBeInTheDocument();
    expect(within(panel).getByText('Discount beyond your authority (8%)')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Submit for approval' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Mark ready to send' })).not.toBeInTheDocument();
  });

  it('previews the figures as the discount changes, and needs no approval within authority', async () => {
    fakeApi({});
    renderBuilder();
    const value = await screen.findByLabelText('Discount value');
    await userEvent.clear(value);
    await userEvent.type(value, '5');
    const panel = figures();
    expect(within(panel).getByText('Not saved yet — preview')).toBeInTheDocument();
    // 5% of 3,075.00 = 153.75 off; net 2,921.25; profit 2,921.25 − 1,398.00 − 65.88 = 1,457.37 → 49.89%.
    expect(within(panel).getByText('−$153.75 (5.00%)')).toBeInTheDocument();
    expect(within(panel).getByText('49.89%')).toBeInTheDocument();
    expect(within(panel).getByText('No approval needed')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Mark ready to send' })).toBeInTheDocument();
  });

  it('does not save a line without a quantity, and says why at the field', async () => {
    fakeApi({});
    const { onSave } = renderBuilder();
    const [first] = await screen.findAllByLabelText('Quantity');
    await userEvent.clear(first!);
    await userEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    expect(onSave).not.toHaveBeenCalled();
    expect(first).toHaveAttribute('aria-invalid', 'true');
    expect(first).toHaveAccessibleDescription(/Enter the quantity\./);
  });

  it('puts the server’s field errors on the line they name', async () => {
    fakeApi({});
    const { onSave } = renderBuilder(makeProposal(), {
      onSave: async () => {
        throw new ApiError(422, {
          code: 'VALIDATION.FAILED',
          message: 'Some fields need attention.',
          details: [{ field: 'options.0.lines.1.quantity', message: 'Too much material for one house.' }],
        });
      },
    });
    const quantities = await screen.findAllByLabelText('Quantity');
    await userEvent.type(quantities[1]!, '0');
    await userEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1));
    const second = screen.getAllByLabelText('Quantity')[1]!;
    expect(second).toHaveAccessibleDescription(/Too much material for one house\./);
    expect(screen.getAllByLabelText('Quantity')[0]).not.toHaveAttribute('aria-invalid');
  });

  it('fills the quantity from the injection plan and marks where it came from', async () => {
    const { calls } = fakeApi({
      'POST /api/calculators/injection-plan': {
        body: {
          points: 11,
          totalLb: '220',
          drumSets: 1,
          leftoverLb: '780',
          runLengthFt: '50',
          spacingFt: '5',
          depthFt: '5',
          lbPerPoint: '20',
          lbPerDrumSet: '1000',
          closed: false,
          endGapFt: '0',
          totalRodDepthFt: '55',
          assumptions: [],
          cautions: ['Call 811 first.'],
        },
      },
    });
    renderBuilder();
    // The second line is material in lb: the plan fills it with the pounds, not the points.
    const buttons = await screen.findAllByRole('button', { name: 'Points from injection plan' });
    await userEvent.click(buttons[1]!);
    await userEvent.type(await screen.findByLabelText('Run length (ft)'), '50');
    expect(screen.getByLabelText('Spacing (ft)')).toHaveValue('5');
    await userEvent.click(screen.getByRole('button', { name: 'Use these points' }));
    await waitFor(() => expect(screen.getAllByLabelText('Quantity')[1]).toHaveValue('220'));
    expect(screen.getAllByLabelText('Quantity')[1]).toHaveAccessibleDescription('From the injection plan');
    const post = calls.filter((c) => c.path === '/api/calculators/injection-plan').at(-1);
    expect(post?.body).toEqual({ runLengthFt: '50', spacingFt: '5', closed: false });
  });
});
