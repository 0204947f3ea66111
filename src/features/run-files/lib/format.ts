// File sizes: the app's one formatter (decimal units), re-exported for the run-files pieces.
export { fileSize } from '../../../lib/format';

export const sideLabel = (side: 'top' | 'bottom') => (side === 'top' ? 'Top' : 'Bottom');
