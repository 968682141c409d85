import { useCallback, useRef, useState } from 'react';
import type { MouseEvent } from 'react';
import { Dropdown, type DropdownProps } from 'primereact/dropdown';
import { useGlobalOnEscapeKey } from 'primereact/hooks';
import { MultiSelect, type MultiSelectProps } from 'primereact/multiselect';

/*
 * Thin wrappers over PrimeReact's Dropdown and MultiSelect, for two things:
 *
 * 1. Both name their hidden text input with `inputId`, which is what a <label htmlFor> points at. The
 *    `app-select` class (app.css) stretches that input, invisible, over the whole control, so a click on the
 *    control, or on the element found by its label, lands on the input itself. MultiSelect then opens by
 *    itself; Dropdown ignores clicks on its input, so Select opens it here.
 * 2. Escape with the list open closes the list only, not the dialog around it (a dialog listens for
 *    Escape on the whole page; an open list now takes it first).
 */

/** PrimeReact's ESC_KEY_HANDLING_PRIORITIES.OVERLAY_PANEL (600; a dialog is 300), not in its typings. */
const OVERLAY_PRIORITY = 600;

function useEscapeWhileOpen(open: boolean, close: () => void) {
  const callback = useCallback(() => close(), [close]);
  useGlobalOnEscapeKey({ callback, when: open, priority: [OVERLAY_PRIORITY, 1] });
}

export function Select({ className, onClick, onShow, onHide, ...props }: DropdownProps) {
  const ref = useRef<Dropdown>(null);
  const [open, setOpen] = useState(false);
  const close = useCallback(() => ref.current?.hide(), []);
  useEscapeWhileOpen(open, close);

  const handleClick = (event: MouseEvent<HTMLDivElement>) => {
    onClick?.(event);
    if (event.defaultPrevented || props.disabled) return;
    const input = ref.current?.getFocusInput();
    if (input && event.target === input) {
      event.preventDefault();
      if (open) ref.current?.hide();
      else ref.current?.show();
    }
  };

  return (
    <Dropdown
      ref={ref}
      {...props}
      className={['app-select', className].filter(Boolean).join(' ')}
      onClick={handleClick}
      onShow={() => {
        setOpen(true);
        onShow?.();
      }}
      onHide={() => {
        setOpen(false);
        onHide?.();
      }}
    />
  );
}

export function MultiSelectField({ className, onShow, onHide, ...props }: MultiSelectProps) {
  const ref = useRef<MultiSelect>(null);
  const [open, setOpen] = useState(false);
  const close = useCallback(() => ref.current?.hide(), []);
  useEscapeWhileOpen(open, close);
  return (
    <MultiSelect
      ref={ref}
      {...props}
      className={['app-select', className].filter(Boolean).join(' ')}
      onShow={() => {
        setOpen(true);
        onShow?.();
      }}
      onHide={() => {
        setOpen(false);
        onHide?.();
      }}
    />
  );
}
