import { useEffect, useId, useState } from 'react';
import { parseNum } from '../hooks/use-settings-draft';

interface Props {
  label: string;
  value: number | undefined;
  onChange: (v: number | undefined) => void;
  unit?: string;
  error?: string;
  disabled?: boolean;
  integer?: boolean;
  className?: string;
}

/** A labelled number field that keeps what is typed until it is a number, with its unit. */
export function NumInput({ label, value, onChange, unit = 'mm', error, disabled, integer, className = '' }: Props) {
  const id = useId();
  const [text, setText] = useState(value === undefined || Number.isNaN(value) ? '' : String(value));
  useEffect(() => {
    const n = parseNum(text);
    if (value !== undefined && !Number.isNaN(value) && n !== value) setText(String(value));
    if (value === undefined && text !== '' && !Number.isNaN(n)) setText('');
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value]);
  const n = parseNum(text);
  const bad = text !== '' && (Number.isNaN(n) || (integer && !Number.isInteger(n)));
  const msg = error ?? (bad ? (integer ? 'A whole number' : 'A number, e.g. 12.5') : undefined);
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-xs font-medium text-ink-700">{label}</label>
      <div className="flex items-center gap-1">
        <input
          id={id}
          inputMode="decimal"
          disabled={disabled}
          aria-invalid={msg ? true : undefined}
          aria-describedby={msg ? `${id}-e` : undefined}
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            const v = parseNum(e.target.value);
            onChange(Number.isNaN(v) ? undefined : v);
          }}
          className={`num w-full rounded border bg-white px-2 py-1 text-right text-sm ${msg ? 'border-sev-error' : 'border-ink-300'} disabled:bg-ink-50`}
        />
        {unit && <span className="num w-6 text-xs text-ink-500">{unit}</span>}
      </div>
      {msg && <p id={`${id}-e`} role="alert" className="text-xs text-sev-error">{msg}</p>}
    </div>
  );
}
