/** Millimetres, 3 decimals, with the unit. */
export function mm(v: number | null | undefined, decimals = 3): string {
  return v == null || !Number.isFinite(v) ? '—' : `${v.toFixed(decimals)} mm`;
}

export function deg(v: number | null | undefined, decimals = 3): string {
  return v == null || !Number.isFinite(v) ? '—' : `${v.toFixed(decimals)}°`;
}

const dateFmt = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
export function dateTime(iso: string | null | undefined): string {
  return iso ? dateFmt.format(new Date(iso)) : '—';
}

export function relativeTime(iso: string, now = Date.now()): string {
  const s = Math.round((now - new Date(iso).getTime()) / 1000);
  if (s < 60) return 'just now';
  if (s < 3600) return `${Math.floor(s / 60)} min ago`;
  if (s < 86400) return `${Math.floor(s / 3600)} h ago`;
  return dateTime(iso);
}
