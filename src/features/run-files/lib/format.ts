/** File sizes as people read them: 812 B, 14.2 kB, 1.3 MB (decimal units). */
export function fileSize(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

export const sideLabel = (side: 'top' | 'bottom') => (side === 'top' ? 'Top' : 'Bottom');
