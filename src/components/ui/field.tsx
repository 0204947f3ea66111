import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react';

interface FieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: ReactNode;
  unit?: string;
}

/** A labelled input with its error beside it (aria-invalid + aria-describedby). */
export const TextField = forwardRef<HTMLInputElement, FieldProps>(function TextField({ label, error, hint, unit, id, className = '', ...rest }, ref) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const msgId = `${inputId}-msg`;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={inputId} className="text-xs font-medium text-ink-700">
        {label}
      </label>
      <div className="flex items-center gap-1">
        <input
          ref={ref}
          id={inputId}
          aria-invalid={error ? true : undefined}
          aria-describedby={error || hint ? msgId : undefined}
          className={`w-full rounded border bg-white px-2 py-1.5 text-sm ${unit ? 'num' : ''} ${error ? 'border-sev-error' : 'border-ink-300'} focus:border-copper-400`}
          {...rest}
        />
        {unit && <span className="num text-xs text-ink-500">{unit}</span>}
      </div>
      {error ? (
        <p id={msgId} role="alert" className="text-xs text-sev-error">
          {error}
        </p>
      ) : hint ? (
        <p id={msgId} className="text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
    </div>
  );
});

export const SelectField = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement> & { label: string; error?: string }>(function SelectField(
  { label, error, id, children, className = '', ...rest },
  ref,
) {
  const autoId = useId();
  const selId = id ?? autoId;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={selId} className="text-xs font-medium text-ink-700">
        {label}
      </label>
      <select ref={ref} id={selId} aria-invalid={error ? true : undefined} className="rounded border border-ink-300 bg-white px-2 py-1.5 text-sm" {...rest}>
        {children}
      </select>
      {error && (
        <p role="alert" className="text-xs text-sev-error">
          {error}
        </p>
      )}
    </div>
  );
});
