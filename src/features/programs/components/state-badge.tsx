import { REVISION_STATE_LABELS, type RevisionStateName } from '../../../../shared/schemas/program.schema';

const TONES: Record<RevisionStateName, string> = {
  draft: 'bg-ink-100 text-ink-700',
  'in-review': 'bg-copper-100 text-copper-800',
  released: 'bg-mask-400/20 text-mask-700',
  superseded: 'bg-ink-100 text-ink-400 line-through',
  withdrawn: 'bg-ink-100 text-ink-400',
};

export function StateBadge({ state }: { state: RevisionStateName }) {
  return <span className={`inline-flex items-center rounded px-1.5 py-0.5 text-2xs font-medium uppercase tracking-wide ${TONES[state]}`}>{REVISION_STATE_LABELS[state]}</span>;
}
