import { useMe } from '../../auth/api/get-me';

/** What the signed-in user may do in the library: librarians and admins edit, engineers propose, everyone reads. */
export function useLibraryAccess() {
  const me = useMe();
  const roles = me.data?.user.roles ?? [];
  const canEdit = roles.includes('admin') || roles.includes('librarian');
  const canPropose = !canEdit && roles.includes('engineer');
  return { canEdit, canPropose, readOnly: !canEdit && !canPropose, email: me.data?.user.email ?? null };
}
