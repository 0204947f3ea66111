// Canvas colours, taken from our palette (tailwind.config.ts) so the canvas and the tables agree.
import theme from '../../../tailwind.config';
import type { FindingSeverity } from '../../../shared/schemas/finding.schema';

const c = theme.theme.extend.colors;

export const CANVAS_COLORS = {
  background: c.ink[950],
  panelFill: c.ink[900],
  panelEdge: c.ink[300],
  boardFill: 'rgba(47, 145, 96, 0.16)', // mask 500 at 16 %
  boardEdge: c.mask[400],
  boardSkipped: c.ink[500],
  boardText: c.mask[400],
  bodyFill: 'rgba(231, 164, 108, 0.55)', // copper 300
  bodyEdge: c.copper[300],
  bodyDimFill: 'rgba(93, 111, 126, 0.25)', // ink 500
  bodyDimEdge: c.ink[600],
  courtyard: c.ink[400],
  mark: c.ink[50],
  label: c.ink[50],
  labelHalo: c.ink[950],
  fiducial: c.copper[200],
  fiducialClear: c.copper[400],
  reach: c.sev.info,
  selection: '#ffffff',
  hover: c.copper[200],
  measure: c.sev.info,
  note: c.copper[400],
  alignImage: c.sev.warning,
  alignPanel: c.mask[400],
  boxSelect: c.copper[300],
} as const;

export const SEVERITY_COLORS: Record<FindingSeverity, string> = {
  error: c.sev.error,
  warning: c.sev.warning,
};
