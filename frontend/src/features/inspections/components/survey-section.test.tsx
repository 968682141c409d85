import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SETTLEMENT_CAUTION, type SettlementResult, type Survey } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { renderApp } from '@/testing/render';
import { SurveySection } from './survey-section';

const INSPECTION_ID = '66666666-6666-4666-8666-666666666666';

const band = {
  code: 'beyond-1/300' as const,
  label: '1/300 or more: the distortion at which cracking of panel walls was first observed',
  source: 'Skempton & MacDonald (1956)',
};

/** What the calculator answers in this test: invented figures, so the screen can only have them from here. */
const answer: SettlementResult = {
  pointCount: 2,
  maxDifferentialIn: '0.75',
  highest: { label: 'A', elevationIn: '0' },
  lowest: { label: 'B', elevationIn: '-0.75' },
  worstPair: { a: 'A', b: 'B', differentialIn: '0.75', distanceFt: '10.00', ratio: '1/160', band },
  worstRatio: '1/160',
  band,
  pairs: [{ a: 'A', b: 'B', differentialIn: '0.75', distanceFt: '10.00', ratio: '1/160', band }],
  neighbourRule: 'Pairs compared: neighbours.',
  tiltPercent: null,
  tiltNote: 'All points lie on one line.',
  caution: SETTLEMENT_CAUTION,
  warnings: [],
};

const empty: Survey = {
  inspectionId: INSPECTION_ID,
  kind: 'inspection',
  referenceLabel: null,
  points: [],
  result: null,
  caution: SETTLEMENT_CAUTION,
};

describe('survey grid', () => {
  it('adds a point, moves down with Enter, and shows the worst ratio the calculator returns', async () => {
    const { calls } = fakeApi({ 'POST /api/calculators/settlement': { body: answer } });
    renderApp(<SurveySection inspectionId={INSPECTION_ID} survey={empty} editable />);

    // A new survey starts at its reference point A.
    expect(screen.getByLabelText('Elevation (in) for point A')).toHaveValue('0');
    expect(screen.getByLabelText('Reference: point A')).toBeChecked();
    expect(screen.queryByLabelText('X (ft) for point B')).not.toBeInTheDocument();

    await userEvent.click(screen.getByRole('button', { name: 'Add point' }));
    const x = await screen.findByLabelText('X (ft) for point B');
    await waitFor(() => expect(x).toHaveFocus());
    await userEvent.type(x, '10');
    await userEvent.type(screen.getByLabelText('Y (ft) for point B'), '0');
    await userEvent.type(screen.getByLabelText('Elevation (in) for point B'), '-0.75');

    expect(await screen.findByTestId('worst-ratio', {}, { timeout: 3000 })).toHaveTextContent('1/160');
    expect(screen.getByText(/A–B: 0.75 in over 10.00 ft/)).toBeInTheDocument();
    expect(screen.getByText(band.label)).toBeInTheDocument();
    const sent = calls.filter((c) => c.path === '/api/calculators/settlement').at(-1)?.body as {
      points: { label: string; elevationIn: string }[];
    };
    expect(sent.points.map((p) => [p.label, p.elevationIn])).toEqual([
      ['A', '0'],
      ['B', '-0.75'],
    ]);

    // Enter on the last row adds the next point, in the same column.
    await userEvent.type(screen.getByLabelText('Elevation (in) for point B'), '{Enter}');
    await waitFor(() => expect(screen.getByLabelText('Elevation (in) for point C')).toHaveFocus());
  });

  it('refuses to save when the reference point does not read 0', async () => {
    const { calls } = fakeApi({ 'POST /api/calculators/settlement': { body: answer } });
    renderApp(<SurveySection inspectionId={INSPECTION_ID} survey={empty} editable />);
    const a = screen.getByLabelText('Elevation (in) for point A');
    await userEvent.clear(a);
    await userEvent.type(a, '0.5');
    await userEvent.click(screen.getByRole('button', { name: 'Add point' }));
    await userEvent.click(screen.getByRole('button', { name: 'Save survey' }));
    expect(a).toHaveAttribute('aria-invalid', 'true');
    expect(a).toHaveAccessibleDescription(/reference point reads 0/);
    expect(calls.some((c) => c.method === 'PUT')).toBe(false);
  });
});
