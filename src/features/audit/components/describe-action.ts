import type { AuditEventDto } from '../../../../shared/schemas/audit.schema';

const LABELS: Record<string, string> = {
  'auth.sign-in': 'Signed in',
  'auth.sign-out': 'Signed out',
  'auth.sign-in-failed': 'Failed sign-in',
  'user.create': 'Created user',
  'user.rename': 'Renamed user',
  'user.roles': 'Changed roles of',
  'user.activate': 'Reactivated user',
  'user.deactivate': 'Deactivated user',
  'user.password-reset': 'Reset password of',
  'user.password-change': 'Changed own password',
};

/** One readable line for an audit event. */
export function describeAction(e: Pick<AuditEventDto, 'action' | 'target' | 'detail'>): string {
  const label = LABELS[e.action] ?? e.action;
  if (e.action === 'auth.sign-in' || e.action === 'auth.sign-out' || e.action === 'user.password-change') return label;
  if (e.action === 'user.roles') {
    const d = e.detail as { before?: string[]; after?: string[] };
    return `${label} ${e.target}: ${(d.before ?? []).join(', ') || 'none'} → ${(d.after ?? []).join(', ') || 'none'}`;
  }
  return e.target ? `${label} ${e.target}` : label;
}
