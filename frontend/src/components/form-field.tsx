import type { ReactNode } from 'react';

export interface ControlProps {
  id: string;
  'aria-invalid': boolean | undefined;
  'aria-describedby': string | undefined;
  invalid: boolean;
}

interface FormFieldProps {
  id: string;
  label: string;
  error?: string | null;
  hint?: ReactNode;
  required?: boolean;
  className?: string;
  children: (control: ControlProps) => ReactNode;
}

/**
 * A label, one control, a hint and an error, wired together for assistive technology: the label names
 * the control and the hint and error describe it.
 */
export function FormField({ id, label, error, hint, required, className, children }: FormFieldProps) {
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [errorId, hintId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={['form-field', className].filter(Boolean).join(' ')}>
      {/* The asterisk sits outside the label so that the field's name is the label text alone. */}
      <div className="form-field__label-row">
        <label htmlFor={id} className="form-field__label">
          {label}
        </label>
        {required ? (
          <span className="form-field__required" aria-hidden="true" title="Required">
            *
          </span>
        ) : null}
      </div>
      {children({
        id,
        'aria-invalid': error ? true : undefined,
        'aria-describedby': describedBy,
        invalid: !!error,
      })}
      {error ? (
        <small id={errorId} className="form-field__error">
          <i className="pi pi-exclamation-circle" aria-hidden="true" /> {error}
        </small>
      ) : null}
      {hint ? (
        <small id={hintId} className="form-field__hint">
          {hint}
        </small>
      ) : null}
    </div>
  );
}
