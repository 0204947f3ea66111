import type { ReactNode } from 'react';
import type { PackageDto } from '../../../../shared/schemas/library.schema';
import { ErrorPanel, ProgressBar } from '../../../components/ui/misc';
import { fixed } from '../../../lib/format';

/** Loading / error / content for a query. */
export function Loaded<T>({ q, label, children }: { q: { isPending: boolean; isError: boolean; error: unknown; data: T | undefined }; label: string; children: (data: T) => ReactNode }) {
  if (q.isPending) return <ProgressBar label={`Loading ${label}`} />;
  if (q.isError) return <ErrorPanel error={q.error} />;
  return <>{children(q.data as T)}</>;
}

export const mm3 = (v: number | null | undefined) => (v == null ? '—' : fixed(v));

export function Mm({ v }: { v: number | null | undefined }) {
  return <span className="num">{v == null ? '—' : `${fixed(v)} mm`}</span>;
}

/** A package as the form's input (everything but the server's bookkeeping). */
export function toInput(p: PackageDto) {
  const { id: _i, version: _v, updatedAt: _u, updatedBy: _b, warnings: _w, aliases, ...fields } = p;
  return { ...fields, aliases: aliases.map((a) => a.pattern) };
}
