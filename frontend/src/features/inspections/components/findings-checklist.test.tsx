import { useState } from 'react';
import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { InspectionFindings } from '@loambook/common';
import { draftFromFindings, toFindingsPatch, type FindingsDraft } from '../findings-draft';
import { FindingsChecklist } from './findings-checklist';

function Harness({
  findings,
  onDraft,
}: {
  findings: Partial<InspectionFindings>;
  onDraft?: (d: FindingsDraft) => void;
}) {
  const [draft, setDraft] = useState(() => draftFromFindings(findings));
  return (
    <FindingsChecklist
      draft={draft}
      onChange={(fn) =>
        setDraft((d) => {
          const next = fn(d);
          onDraft?.(next);
          return next;
        })
      }
      errors={{}}
      disabled={false}
    />
  );
}

describe('findings checklist', () => {
  it('lists the items still unanswered, and an answer takes one off', async () => {
    render(<Harness findings={{ interiorCracks: [], floorSlope: { observed: false } }} />);
    expect(screen.getByText('7 items still unanswered')).toBeInTheDocument();
    const list = screen.getByRole('list', { name: 'Unanswered items' });
    expect(within(list).getByRole('link', { name: 'Exterior cracks' })).toHaveAttribute(
      'href',
      '#finding-exteriorCracks',
    );
    expect(within(list).queryByRole('link', { name: 'Interior cracks' })).not.toBeInTheDocument();
    expect(within(list).queryByRole('link', { name: 'Floor slope noticed' })).not.toBeInTheDocument();

    const erosion = screen.getByRole('region', { name: 'Erosion' });
    expect(within(erosion).getByText('Unanswered')).toBeInTheDocument();
    await userEvent.click(within(erosion).getByRole('radio', { name: 'Not seen' }));
    expect(within(erosion).getByText('Answered')).toBeInTheDocument();
    expect(screen.getByText('6 items still unanswered')).toBeInTheDocument();
    expect(within(list).queryByRole('link', { name: 'Erosion' })).not.toBeInTheDocument();
  });

  it('counts "None seen" as an answer and sends an empty list for it', async () => {
    let last: FindingsDraft | null = null;
    render(<Harness findings={{}} onDraft={(d) => (last = d)} />);
    expect(screen.getByText('9 items still unanswered')).toBeInTheDocument();
    const exterior = screen.getByRole('region', { name: 'Exterior cracks' });
    await userEvent.click(within(exterior).getByRole('button', { name: 'None seen' }));
    expect(screen.getByText('8 items still unanswered')).toBeInTheDocument();
    expect(toFindingsPatch(last!)).toEqual({ exteriorCracks: [] });
  });
});
