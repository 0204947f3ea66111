// Home's "Next for you": the work waiting for each of the signed-in user's roles, most pressing
// first, each with the page where it is done. Pure: the data in, the tasks out.
import type { Role, UserDto } from '../../../shared/schemas/auth.schema';
import type { ProposalDto, UnmatchedDto } from '../../../shared/schemas/library.schema';
import type { ProgramDto, RunFileDto } from '../../../shared/schemas/program.schema';

export interface HomeTask {
  role: Role;
  /** what to do, one line */
  title: string;
  /** why or which, one short line */
  detail: string;
  to: string;
  /** the link's words */
  action: string;
}

export interface HomeData {
  programs?: ProgramDto[];
  proposals?: ProposalDto[];
  unmatched?: UnmatchedDto[];
  runFiles?: RunFileDto[];
  users?: UserDto[];
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function engineerTasks(me: string, programs: ProgramDto[]): HomeTask[] {
  const out: HomeTask[] = [];
  const revs = programs.flatMap((p) => p.revisions.map((r) => ({ p, r })));
  for (const { p, r } of revs.filter(({ r }) => r.state === 'in-review' && r.author?.id !== me)) {
    out.push({ role: 'engineer', title: `Review ${p.name} rev ${r.label}`, detail: `submitted by ${r.author?.name ?? 'another engineer'}`, to: `/programs/revisions/${r.id}/release`, action: 'Review' });
  }
  for (const { p, r } of revs.filter(({ r }) => r.state === 'draft' && r.author?.id === me)) {
    const [stage, why] = !r.centroidName
      ? ['import', 'import its centroid file']
      : r.errors === null
        ? ['verify', 'set the panel, then run the checks']
        : (r.openErrors ?? 0) > 0
          ? ['verify', `${plural(r.openErrors ?? 0, 'error')} to fix or waive`]
          : ['release', 'checked: submit it for review'];
    out.push({ role: 'engineer', title: `Continue ${p.name} rev ${r.label}`, detail: why, to: `/programs/revisions/${r.id}/${stage}`, action: 'Continue' });
  }
  for (const { p, r } of revs.filter(({ r }) => r.state === 'in-review' && r.author?.id === me)) {
    out.push({ role: 'engineer', title: `${p.name} rev ${r.label} is with a reviewer`, detail: 'another engineer approves or returns it', to: `/programs/revisions/${r.id}/release`, action: 'Open' });
  }
  if (out.length === 0) out.push({ role: 'engineer', title: 'Nothing open: start a program', detail: 'create a program, then import its centroid file', to: '/programs', action: 'Programs' });
  return out;
}

function librarianTasks(proposals: ProposalDto[], unmatched: UnmatchedDto[]): HomeTask[] {
  const out: HomeTask[] = [];
  const open = proposals.filter((p) => p.status === 'open');
  if (open.length) out.push({ role: 'librarian', title: `Decide ${plural(open.length, 'proposal')}`, detail: `the oldest from ${open[open.length - 1].proposerEmail}`, to: '/library/proposals', action: 'Proposals' });
  const missing = unmatched.filter((u) => u.status === 'open');
  if (missing.length) {
    out.push({ role: 'librarian', title: `Give ${plural(missing.length, 'footprint')} a package`, detail: `seen in programs and matched by nothing, e.g. ${missing.slice(0, 3).map((u) => u.footprint).join(', ')}`, to: '/library/unmatched', action: 'Unmatched' });
  }
  if (out.length === 0) out.push({ role: 'librarian', title: 'The library has nothing waiting', detail: 'no open proposals and no unmatched footprints', to: '/library', action: 'Library' });
  return out;
}

function operatorTasks(runFiles: RunFileDto[]): HomeTask[] {
  const current = runFiles.filter((f) => f.state === 'released');
  if (current.length === 0) return [{ role: 'operator', title: 'No released programs yet', detail: 'run files appear here once a program is released', to: '/run-files', action: 'Run files' }];
  const latest = [...current].sort((a, b) => (b.releasedAt ?? '').localeCompare(a.releasedAt ?? ''))[0];
  return [{ role: 'operator', title: `Set up ${latest.programName} rev ${latest.label}`, detail: `the latest release (${plural(current.length, 'program')} released in all); its run files are on Run files`, to: `/run-files/${latest.revisionId}/setup-sheet`, action: 'Set-up sheet' }];
}

function adminTasks(users: UserDto[]): HomeTask[] {
  const out: HomeTask[] = [];
  const noRole = users.filter((u) => u.active && u.roles.length === 0);
  if (noRole.length) out.push({ role: 'admin', title: `Give ${plural(noRole.length, 'user')} a role`, detail: noRole.slice(0, 3).map((u) => u.email).join(', '), to: '/admin/users', action: 'Users' });
  const never = users.filter((u) => u.active && u.roles.length > 0 && !u.lastSignInAt);
  if (never.length) out.push({ role: 'admin', title: `${plural(never.length, 'user has', 'users have')} not signed in yet`, detail: 'check their invitation e-mail in the Outbox', to: '/admin/outbox', action: 'Outbox' });
  if (out.length === 0) out.push({ role: 'admin', title: 'Everyone has a role and has signed in', detail: 'the audit log shows what happened lately', to: '/admin/audit', action: 'Audit log' });
  return out;
}

/** The tasks of every role the user holds (admins also see the engineer's, librarian's… when they hold those roles). */
export function homeTasks(user: Pick<UserDto, 'id' | 'roles'>, data: HomeData): HomeTask[] {
  const out: HomeTask[] = [];
  for (const role of user.roles) {
    if (role === 'engineer' && data.programs) out.push(...engineerTasks(user.id, data.programs));
    if (role === 'librarian' && data.proposals && data.unmatched) out.push(...librarianTasks(data.proposals, data.unmatched));
    if (role === 'operator' && data.runFiles) out.push(...operatorTasks(data.runFiles));
    if (role === 'admin' && data.users) out.push(...adminTasks(data.users));
  }
  return out;
}
