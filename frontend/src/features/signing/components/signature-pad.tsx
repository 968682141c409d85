import { useCallback, useEffect, useRef, useState } from 'react';
import type { PointerEvent as ReactPointerEvent } from 'react';
import { Button } from 'primereact/button';

interface SignaturePadProps {
  /** The drawing as a PNG data URL after each stroke; null when cleared. */
  onChange: (dataUrl: string | null) => void;
  disabled?: boolean;
  /** Id of the text that describes the pad (what signing means). */
  describedBy?: string;
}

/** Intrinsic size when the pad cannot measure itself (tests, a hidden tab). */
const FALLBACK = { width: 900, height: 300 };
/** The server refuses an image over 4000 px a side (SIGNATURE_MAX_SIDE_PX). */
const MAX_SIDE = 3000;
const INK = '#1d2340';

/**
 * A signature drawn with a finger, a pen or a mouse: pointer events on a <canvas>, exported as a PNG data
 * URL. The canvas keeps its pixel size once set (a resize would wipe the drawing); strokes are mapped from
 * the element's size on screen to those pixels, so it stays right when the page reflows.
 */
export function SignaturePad({ onChange, disabled = false, describedBy }: SignaturePadProps) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const drawing = useRef<{ id: number; x: number; y: number } | null>(null);
  const [hasInk, setHasInk] = useState(false);

  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas) return;
    const rect = canvas.getBoundingClientRect();
    const ratio = Math.min(window.devicePixelRatio || 1, 3);
    const width = rect.width > 0 ? Math.round(rect.width * ratio) : FALLBACK.width;
    const height = rect.height > 0 ? Math.round(rect.height * ratio) : FALLBACK.height;
    canvas.width = Math.min(width, MAX_SIDE);
    canvas.height = Math.min(height, MAX_SIDE);
  }, []);

  const context = () => {
    const ctx = canvasRef.current?.getContext('2d');
    if (!ctx) return null;
    const canvas = canvasRef.current!;
    ctx.strokeStyle = INK;
    ctx.fillStyle = INK;
    ctx.lineCap = 'round';
    ctx.lineJoin = 'round';
    // About 2.5 CSS px wide whatever the screen's density.
    const rect = canvas.getBoundingClientRect();
    ctx.lineWidth = Math.max(2, 2.5 * (rect.width > 0 ? canvas.width / rect.width : 1));
    return ctx;
  };

  const point = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    const canvas = canvasRef.current!;
    const rect = canvas.getBoundingClientRect();
    const sx = rect.width > 0 ? canvas.width / rect.width : 1;
    const sy = rect.height > 0 ? canvas.height / rect.height : 1;
    return { x: ((event.clientX ?? 0) - rect.left) * sx, y: ((event.clientY ?? 0) - rect.top) * sy };
  };

  const onPointerDown = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    if (disabled || (event.pointerType === 'mouse' && event.button !== 0)) return;
    event.preventDefault();
    const ctx = context();
    if (!ctx) return;
    event.currentTarget.setPointerCapture?.(event.pointerId);
    const p = point(event);
    drawing.current = { id: event.pointerId, ...p };
    // A dot, so that a tap leaves a mark too.
    ctx.beginPath();
    ctx.arc(p.x, p.y, ctx.lineWidth / 2, 0, Math.PI * 2);
    ctx.fill();
  };

  const onPointerMove = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    const last = drawing.current;
    if (!last || last.id !== event.pointerId) return;
    event.preventDefault();
    const ctx = context();
    if (!ctx) return;
    const p = point(event);
    ctx.beginPath();
    ctx.moveTo(last.x, last.y);
    ctx.lineTo(p.x, p.y);
    ctx.stroke();
    drawing.current = { id: last.id, ...p };
  };

  const finish = (event: ReactPointerEvent<HTMLCanvasElement>) => {
    const last = drawing.current;
    if (!last || last.id !== event.pointerId) return;
    drawing.current = null;
    event.currentTarget.releasePointerCapture?.(event.pointerId);
    setHasInk(true);
    onChange(canvasRef.current!.toDataURL('image/png'));
  };

  const clear = useCallback(() => {
    const canvas = canvasRef.current;
    canvas?.getContext('2d')?.clearRect(0, 0, canvas.width, canvas.height);
    drawing.current = null;
    setHasInk(false);
    onChange(null);
  }, [onChange]);

  return (
    <div className={`signature-pad${disabled ? ' signature-pad--disabled' : ''}`}>
      <div className="signature-pad__frame">
        <canvas
          ref={canvasRef}
          className="signature-pad__canvas"
          role="img"
          aria-label="Signature pad"
          aria-describedby={describedBy}
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={finish}
          onPointerCancel={finish}
          onPointerLeave={(e) => {
            if (e.pointerType === 'mouse') finish(e);
          }}
        />
        <span className="signature-pad__line" aria-hidden="true">
          <span>✕</span>
        </span>
        {!hasInk ? (
          <span className="signature-pad__prompt" aria-hidden="true">
            Sign here with your finger or mouse
          </span>
        ) : null}
      </div>
      <div className="signature-pad__actions">
        <span className="signature-pad__status" aria-live="polite">
          {hasInk ? 'Signature drawn.' : 'No signature yet.'}
        </span>
        <Button
          type="button"
          label="Clear"
          icon="pi pi-eraser"
          outlined
          severity="secondary"
          onClick={clear}
          disabled={disabled}
        />
      </div>
    </div>
  );
}
