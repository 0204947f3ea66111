// What every part of the programs module reads the same way: the signed-in person, a revision
// row (locked for writing when asked), a revision's "program label" and people by id.
import { In, type EntityManager } from 'typeorm';
import { Program, ProgramRevision } from '../../db/entities/program.entity';
import { User } from '../../db/entities/user.entity';
import { NotFoundError } from '../../lib/errors';

export interface ServiceUser {
  id: string;
  email: string;
  roles: string[];
}

/** A person as lists show them; null for no one (or someone since deleted). */
export type UserRef = (id: string | null) => { id: string; name: string; email: string } | null;

/** One revision row, whole; `lock` holds it (pessimistic write) until the transaction ends. */
export async function loadRevision(m: EntityManager, id: string, lock = false): Promise<ProgramRevision> {
  const r = await m.getRepository(ProgramRevision).findOne({ where: { id }, ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}) });
  if (!r) throw new NotFoundError('The revision');
  return r;
}

/** "<program name> <revision label>", as audit events and mails name a revision. */
export async function revisionLabel(m: EntityManager, r: Pick<ProgramRevision, 'programId' | 'label'>): Promise<string> {
  const p = await m.getRepository(Program).findOneByOrFail({ id: r.programId });
  return `${p.name} ${r.label}`;
}

/** The people with these ids, read in one query. */
export async function userRefs(m: EntityManager, ids: (string | null)[]): Promise<UserRef> {
  const want = [...new Set(ids.filter((x): x is string => !!x))];
  const users = want.length ? await m.getRepository(User).findBy({ id: In(want) }) : [];
  const map = new Map(users.map((u) => [u.id, { id: u.id, name: u.name, email: u.email }]));
  return (id: string | null) => (id ? (map.get(id) ?? null) : null);
}
