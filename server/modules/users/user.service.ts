import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import type { CreateUserInput, Role, UpdateUserInput, UserDto } from '../../../shared/schemas/auth.schema';
import { User } from '../../db/entities/user.entity';
import { passwordStrength } from '../../../shared/password-strength';
import { BadRequestError, ConflictError, NotFoundError, ValidationError } from '../../lib/errors';
import type { AuditActor, AuditService } from '../audit/audit.service';

/** bcrypt cost 12 (OWASP Password Storage Cheat Sheet asks for at least 10). */
export const BCRYPT_COST = 12;

export function toUserDto(u: User): UserDto {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    roles: [...u.roles].sort(),
    active: u.active,
    lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
    createdAt: u.createdAt.toISOString(),
    version: u.version,
  };
}

/**
 * Refuses a password that is easy to guess (the zxcvbn estimator, minimum score 3 of 4), naming
 * the field and saying why and what would help. The person's e-mail and name count as guessable.
 */
export function assertStrongPassword(password: string, field: string, knownToOthers: string[]): void {
  const s = passwordStrength(password, knownToOthers);
  if (!s.ok) throw new ValidationError(s.message, [{ path: field, message: [s.warning, ...s.suggestions].filter(Boolean).join(' ') || `Too easy to guess (${s.label})` }]);
}

export class UserService {
  constructor(
    private readonly ds: DataSource,
    private readonly audit: AuditService,
  ) {}

  private get repo() {
    return this.ds.getRepository(User);
  }

  async list(): Promise<UserDto[]> {
    const users = await this.repo.find({ order: { name: 'ASC' } });
    return users.map(toUserDto);
  }

  async get(id: string): Promise<User> {
    const u = await this.repo.findOneBy({ id });
    if (!u) throw new NotFoundError('The user');
    return u;
  }

  async findActiveByEmail(email: string): Promise<User | null> {
    return this.repo.findOneBy({ email: email.toLowerCase(), active: true });
  }

  async create(input: CreateUserInput, actor: AuditActor | null, ip: string | null = null): Promise<UserDto> {
    const existing = await this.repo.findOneBy({ email: input.email });
    if (existing) {
      throw new ConflictError(`A user with the e-mail ${input.email} already exists.`, [
        { path: 'email', message: 'Already in use' },
      ]);
    }
    assertStrongPassword(input.password, 'password', [input.email, input.name]);
    const passwordHash = await bcrypt.hash(input.password, BCRYPT_COST);
    const user = await this.ds.transaction(async (m) => {
      const u = m.getRepository(User).create({ email: input.email, name: input.name, roles: dedupe(input.roles), passwordHash, active: true });
      await m.getRepository(User).save(u);
      await this.audit.record(actor, 'user.create', u.email, { roles: u.roles }, ip, m);
      return u;
    });
    return toUserDto(user);
  }

  async update(id: string, input: UpdateUserInput, actor: AuditActor, ip: string | null = null): Promise<UserDto> {
    return this.ds.transaction(async (m) => {
      const repo = m.getRepository(User);
      const u = await repo.findOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      if (!u) throw new NotFoundError('The user');
      if (u.version !== input.version) {
        throw new ConflictError(
          `${u.email} was changed by someone else since you opened it (version ${input.version}, now ${u.version}). Reload to see their change, then make yours again.`,
        );
      }
      if (actor.id === u.id && (input.active === false || (input.roles && !input.roles.includes('admin') && u.roles.includes('admin')))) {
        throw new BadRequestError('You cannot deactivate yourself or remove your own admin role; ask another admin.');
      }
      const before = { name: u.name, roles: [...u.roles], active: u.active };
      if (input.name !== undefined) u.name = input.name;
      if (input.roles !== undefined) u.roles = dedupe(input.roles);
      if (input.active !== undefined) u.active = input.active;
      await repo.save(u);
      const after = { name: u.name, roles: [...u.roles], active: u.active };
      if (before.name !== after.name) await this.audit.record(actor, 'user.rename', u.email, { before: before.name, after: after.name }, ip, m);
      if (before.roles.sort().join() !== [...after.roles].sort().join()) await this.audit.record(actor, 'user.roles', u.email, { before: before.roles, after: after.roles }, ip, m);
      if (before.active !== after.active) await this.audit.record(actor, after.active ? 'user.activate' : 'user.deactivate', u.email, {}, ip, m);
      if (!after.active) {
        // Sign the user out everywhere.
        await m.query(`DELETE FROM "session" WHERE sess->'passport'->>'user' = $1`, [u.id]);
      }
      return toUserDto(u);
    });
  }

  async resetPassword(id: string, password: string, actor: AuditActor, ip: string | null = null): Promise<void> {
    const target = await this.get(id);
    assertStrongPassword(password, 'password', [target.email, target.name]);
    const passwordHash = await bcrypt.hash(password, BCRYPT_COST);
    await this.ds.transaction(async (m) => {
      const u = await m.getRepository(User).findOneBy({ id });
      if (!u) throw new NotFoundError('The user');
      u.passwordHash = passwordHash;
      await m.getRepository(User).save(u);
      await m.query(`DELETE FROM "session" WHERE sess->'passport'->>'user' = $1`, [u.id]);
      await this.audit.record(actor, 'user.password-reset', u.email, {}, ip, m);
    });
  }

  /**
   * Changes one's own password and ends the user's other sessions (other browsers and devices
   * must sign in again with the new password); `keepSessionId`, the session making the change, stays.
   */
  async changeOwnPassword(user: User, current: string, next: string, ip: string | null, keepSessionId?: string): Promise<void> {
    if (!(await bcrypt.compare(current, user.passwordHash))) {
      throw new BadRequestError('The current password is not right.', [{ path: 'currentPassword', message: 'Not right' }]);
    }
    assertStrongPassword(next, 'newPassword', [user.email, user.name]);
    const passwordHash = await bcrypt.hash(next, BCRYPT_COST);
    await this.ds.transaction(async (m) => {
      await m.getRepository(User).update({ id: user.id }, { passwordHash });
      const ended: unknown[] = await m.query(`DELETE FROM "session" WHERE sess->'passport'->>'user' = $1 AND sid IS DISTINCT FROM $2 RETURNING sid`, [user.id, keepSessionId ?? null]);
      await this.audit.record({ id: user.id, email: user.email }, 'user.password-change', user.email, { otherSessionsEnded: ended.length }, ip, m);
    });
  }

  async touchSignIn(id: string): Promise<void> {
    // A plain UPDATE: signing in is not an edit and must not bump the row's version.
    await this.repo.query('UPDATE "users" SET "last_sign_in_at" = now() WHERE "id" = $1', [id]);
  }

  async emailsWithRole(role: Role): Promise<string[]> {
    const rows = await this.repo
      .createQueryBuilder('u')
      .where('u.active = true')
      .andWhere(':role = ANY(u.roles)', { role })
      .orderBy('u.email')
      .getMany();
    return rows.map((u) => u.email);
  }
}

function dedupe(roles: Role[]): Role[] {
  return [...new Set(roles)].sort();
}
