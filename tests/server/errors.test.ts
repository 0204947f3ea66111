import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable, uniqueViolation } from '../../server/lib/errors';

// Codes and texts as PostgreSQL and node-postgres give them (PostgreSQL documentation, appendix
// "PostgreSQL Error Codes"; node-postgres messages from memory).
describe('unique violations → 409 naming the field', () => {
  const pg = (constraint: string, detail: string) => ({ name: 'QueryFailedError', driverError: { code: '23505', constraint, detail } });

  it.each([
    ['uq_programs_name_ci', 'Key (lower(name::text))=(led-strip) already exists.', 'name', /program with this name.*led-strip/],
    ['UQ_97672ac88f789774dd47f7c8be3', 'Key (email)=(a@b.example) already exists.', 'email', /user with this e-mail.*a@b\.example/],
    ['uq_library_aliases_pattern_key', 'Key (pattern_key)=(res-0603*) already exists.', 'pattern', /alias/],
    ['uq_library_nozzles_name_ci', 'Key (lower(name::text))=(n07) already exists.', 'name', /nozzle/],
  ])('%s', (constraint, detail, path, message) => {
    const e = uniqueViolation(pg(constraint, detail));
    expect(e?.status).toBe(409);
    expect(e?.errors.map((x) => x.path)).toEqual([path]);
    expect(e?.message).toMatch(message);
  });

  it('an index not listed is named from the column in the detail', () => {
    expect(uniqueViolation(pg('uq_something_new', 'Key (part_number)=(X-1) already exists.'))?.errors[0].path).toBe('partNumber');
    expect(uniqueViolation(pg('uq_other', 'Key (lower(display_name::text))=(x) already exists.'))?.errors[0].path).toBe('displayName');
  });

  it('other errors are not unique violations', () => {
    expect(uniqueViolation({ driverError: { code: '23503' } })).toBeNull();
    expect(uniqueViolation(new Error('boom'))).toBeNull();
    expect(uniqueViolation(null)).toBeNull();
  });
});

describe('database unavailable → 503', () => {
  it.each([
    ['refused', Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:54329'), { code: 'ECONNREFUSED' })],
    ['refused on IPv4 and IPv6', Object.assign(new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })], ''), {})],
    ['admin shutdown', { driverError: { code: '57P01' } }],
    ['starting up', { code: '57P03' }],
    ['connection failure', { code: '08006' }],
    ['too many connections', { code: '53300' }],
    ['dropped connection', new Error('Connection terminated unexpectedly')],
    ['pool timeout', new Error('timeout exceeded when trying to connect')],
  ])('%s', (_label, err) => {
    expect(isDatabaseUnavailable(err)).toBe(true);
  });

  it.each([
    ['a unique violation', { driverError: { code: '23505' } }],
    ['a syntax error', { code: '42601' }],
    ['a plain bug', new TypeError('x is undefined')],
  ])('not for %s', (_label, err) => {
    expect(isDatabaseUnavailable(err)).toBe(false);
  });
});
