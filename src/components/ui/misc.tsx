import type { ReactNode } from 'react';

export function PageHeader({ title, subtitle, actions }: { title: string; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-5 flex items-end justify-between gap-4 border-b border-ink-200 pb-3">
      <div>
        <h1 className="text-xl font-semibold text-ink-900">{title}</h1>
        {subtitle && <p className="mt-0.5 text-sm text-ink-500">{subtitle}</p>}
      </div>
      {actions && <div className="flex items-center gap-2">{actions}</div>}
    </div>
  );
}

export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-center justify-center gap-2 rounded border border-dashed border-ink-300 bg-white px-6 py-10 text-center">
      <p className="font-medium text-ink-800">{title}</p>
      {children && <div className="max-w-md text-sm text-ink-500">{children}</div>}
      {action}
    </div>
  );
}

export function Badge({ children, tone = 'neutral' }: { children: ReactNode; tone?: 'neutral' | 'copper' | 'mask' | 'error' | 'warning' }) {
  const tones = {
    neutral: 'bg-ink-100 text-ink-700',
    copper: 'bg-copper-100 text-copper-800',
    mask: 'bg-mask-400/20 text-mask-700',
    error: 'bg-sev-error/15 text-sev-error',
    warning: 'bg-sev-warning/20 text-copper-800',
  } as const;
  return <span className={`inline-flex items-center rounded px-1.5 py-0.5 text-2xs font-medium uppercase tracking-wide ${tones[tone]}`}>{children}</span>;
}

/** Indeterminate or determinate progress; announced to screen readers. */
export function ProgressBar({ value, label }: { value?: number; label: string }) {
  return (
    <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={value} className="h-1.5 w-full overflow-hidden rounded bg-ink-200">
      <div
        className={`h-full bg-copper-400 ${value === undefined ? 'w-1/3 animate-pulse' : ''}`}
        style={value === undefined ? undefined : { width: `${Math.max(0, Math.min(100, value))}%` }}
      />
    </div>
  );
}

export function ErrorPanel({ error }: { error: unknown }) {
  const msg = error instanceof Error ? error.message : String(error);
  return (
    <div role="alert" className="rounded border border-sev-error/40 bg-sev-error/5 px-4 py-3 text-sm text-sev-error">
      {msg}
    </div>
  );
}
