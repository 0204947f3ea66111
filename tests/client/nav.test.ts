import { describe, expect, it } from 'vitest';
import { navFor } from '../../src/app/nav';

describe('navigation per role', () => {
  it.each([
    [['operator'], ['/', '/account']],
    [['engineer'], ['/', '/account']],
    [['admin'], ['/', '/account', '/admin/users', '/admin/audit', '/admin/outbox']],
  ] as const)('%j sees %j', (roles, paths) => {
    expect(navFor(roles).map((n) => n.to)).toEqual(paths);
  });

  it('gives a user with several roles the union', () => {
    const both = navFor(['operator', 'admin']).map((n) => n.to);
    expect(both).toContain('/admin/users');
  });
});
