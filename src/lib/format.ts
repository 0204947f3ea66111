// Lengths and angles: the engine's one formatter (shared/core/format.ts), 3 decimals unless asked,
// never "-0.000". `mm` and `deg` add the unit; `fixed` gives the number alone (tables with the unit
// in the header).
export { fixed, lengthText as mm, angleText as deg } from '../../shared/core';

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

// File sizes as people read them, in decimal units (1 kB = 1000 bytes): 812 B, 41.2 kB, 1.3 MB.
// The one rule for sizes on every page and in the server's messages (shared/core/format.ts).
export { byteSizeText as fileSize } from '../../shared/core';
