import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { makeSigningDoc } from '@/features/proposals/testing/fixtures';
import { SignaturePad } from './signature-pad';
import { SigningForm } from './signing-form';

// jsdom has no canvas: a context that records the strokes, and a fixed PNG for the export.
const PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';
let strokes: string[];

beforeEach(() => {
  strokes = [];
  const ctx = {
    beginPath: () => strokes.push('begin'),
    arc: () => strokes.push('arc'),
    fill: () => strokes.push('fill'),
    moveTo: () => strokes.push('moveTo'),
    lineTo: () => strokes.push('lineTo'),
    stroke: () => strokes.push('stroke'),
    clearRect: () => strokes.push('clear'),
  } as unknown as CanvasRenderingContext2D;
  vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(ctx as never);
  vi.spyOn(HTMLCanvasElement.prototype, 'toDataURL').mockReturnValue(PNG);
});

afterEach(() => vi.restoreAllMocks());

function draw(canvas: HTMLElement) {
  fireEvent.pointerDown(canvas, { pointerId: 1, clientX: 10, clientY: 20, button: 0, pointerType: 'touch' });
  fireEvent.pointerMove(canvas, { pointerId: 1, clientX: 40, clientY: 30, pointerType: 'touch' });
  fireEvent.pointerMove(canvas, { pointerId: 1, clientX: 80, clientY: 25, pointerType: 'touch' });
  fireEvent.pointerUp(canvas, { pointerId: 1, clientX: 80, clientY: 25, pointerType: 'touch' });
}

describe('signature pad', () => {
  it('gives a PNG data URL once a stroke is drawn, and nothing after Clear', async () => {
    const onChange = vi.fn();
    render(<SignaturePad onChange={onChange} />);
    const canvas = screen.getByRole('img', { name: 'Signature pad' });
    expect(onChange).not.toHaveBeenCalled();
    draw(canvas);
    expect(strokes).toContain('lineTo');
    expect(onChange).toHaveBeenLastCalledWith(PNG);
    expect(screen.getByText('Signature drawn.')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Clear' }));
    expect(onChange).toHaveBeenLastCalledWith(null);
    expect(strokes).toContain('clear');
  });

  it('does not draw when a move comes without a press', () => {
    const onChange = vi.fn();
    render(<SignaturePad onChange={onChange} />);
    const canvas = screen.getByRole('img', { name: 'Signature pad' });
    fireEvent.pointerMove(canvas, { pointerId: 1, clientX: 40, clientY: 30 });
    fireEvent.pointerUp(canvas, { pointerId: 1 });
    expect(strokes).not.toContain('lineTo');
    expect(onChange).not.toHaveBeenCalled();
  });
});

describe('signing form', () => {
  it('keeps “Sign contract” disabled until an option, every notice, a signature and the name are given', async () => {
    const onSign = vi.fn(async () => undefined);
    render(<SigningForm doc={makeSigningDoc()} onSign={onSign} pending={false} />);
    const sign = screen.getByRole('button', { name: 'Sign contract' });
    expect(sign).toBeDisabled();
    expect(screen.getByText('If you sign today, you may cancel until', { exact: false })).toHaveTextContent(
      'midnight at the end of Friday, December 4, 2026',
    );

    // Option 2 is over Florida's $2,500 line: two notices to read.
    await userEvent.click(screen.getAllByRole('button', { name: 'Choose this option' })[1]!);
    const notices = screen.getAllByRole('checkbox');
    expect(notices).toHaveLength(2);
    await userEvent.click(screen.getByLabelText('I have read “Buyer’s right to cancel”'));
    draw(screen.getByRole('img', { name: 'Signature pad' }));
    await userEvent.type(screen.getByLabelText('Your full name'), 'Marisol Ebbing');
    // One notice still unread.
    expect(sign).toBeDisabled();

    await userEvent.click(screen.getByLabelText('I have read “Florida construction lien law disclosure”'));
    expect(sign).toBeEnabled();
    await userEvent.click(sign);
    await waitFor(() => expect(onSign).toHaveBeenCalledTimes(1));
    expect(onSign).toHaveBeenCalledWith({
      optionId: 'opt-b',
      signerName: 'Marisol Ebbing',
      signaturePng: PNG,
      acknowledgedNotices: ['FTC_429', 'FL_713_015'],
    });
  });

  it('sends only the chosen option’s notices, and disables again when the signature is cleared', async () => {
    const onSign = vi.fn(async () => undefined);
    render(<SigningForm doc={makeSigningDoc()} onSign={onSign} pending={false} />);
    await userEvent.click(screen.getAllByRole('button', { name: 'Choose this option' })[0]!);
    expect(screen.getAllByRole('checkbox')).toHaveLength(1);
    await userEvent.click(screen.getByLabelText('I have read “Buyer’s right to cancel”'));
    draw(screen.getByRole('img', { name: 'Signature pad' }));
    await userEvent.type(screen.getByLabelText('Your full name'), '  Marisol Ebbing ');
    const sign = screen.getByRole('button', { name: 'Sign contract' });
    expect(sign).toBeEnabled();
    await userEvent.click(screen.getByRole('button', { name: 'Clear' }));
    expect(sign).toBeDisabled();
    draw(screen.getByRole('img', { name: 'Signature pad' }));
    await userEvent.click(sign);
    await waitFor(() => expect(onSign).toHaveBeenCalledTimes(1));
    expect(onSign.mock.calls[0]).toEqual([
      {
        optionId: 'opt-a',
        signerName: 'Marisol Ebbing',
        signaturePng: PNG,
        acknowledgedNotices: ['FTC_429'],
      },
    ]);
  });
});
