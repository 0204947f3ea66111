import { describe, expect, it } from 'vitest';
import { navFor } from '../../src/app/nav';

describe('navigation per role', () => {
  it.each([
    [['operator'], ['/', '/run-files', '/account']],
    [['librarian'], ['/', '/library', '/account']],
    [['engineer'], ['/', '/programs', '/library', '/run-files', '/panel-preview', '/tokens', '/account']],
    [['admin'], ['/', '/programs', '/library', '/run-files', '/panel-preview', '/tokens', '/account', '/admin/users', '/admin/audit', '/admin/outbox']],
  ] as const)('%j sees %j', (roles, paths) => {
    expect(navFor(roles).map((n) => n.to)).toEqual(paths);
  });

  it('gives a user with several roles the union', () => {
    const both = navFor(['operator', 'admin']).map((n) => n.to);
    expect(both).toContain('/admin/users');
  });
});
