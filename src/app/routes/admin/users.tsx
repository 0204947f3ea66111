import { zodResolver } from '@hookform/resolvers/zod';
import type { ColumnDef } from '@tanstack/react-table';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from 'sonner';
import { createUserInputSchema, ROLE_LABELS, ROLES, type CreateUserInput, type Role, type UserDto } from '../../../../shared/schemas/auth.schema';
import { Button } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { TextField } from '../../../components/ui/field';
import { Badge, ErrorPanel, PageHeader, ProgressBar } from '../../../components/ui/misc';
import { useCreateUser, useResetPassword, useUpdateUser, useUsers } from '../../../features/users/api/users';
import { PasswordStrengthNote, usePasswordStrength } from '../../../features/users/components/password-strength';
import { ApiError } from '../../../lib/api-client';
import { dateTime } from '../../../lib/format';

const columns: ColumnDef<UserDto, any>[] = [
  { accessorKey: 'name', header: 'Name' },
  { accessorKey: 'email', header: 'E-mail' },
  {
    id: 'roles',
    header: 'Roles',
    accessorFn: (u) => u.roles.join(' '),
    cell: ({ row }) => (
      <span className="flex gap-1">
        {row.original.roles.map((r) => (
          <Badge key={r} tone="copper">{ROLE_LABELS[r]}</Badge>
        ))}
      </span>
    ),
  },
  { id: 'active', header: 'Status', accessorFn: (u) => (u.active ? 'active' : 'deactivated'), cell: ({ getValue }) => (getValue() === 'active' ? <Badge tone="mask">active</Badge> : <Badge>deactivated</Badge>) },
  { accessorKey: 'lastSignInAt', header: 'Last sign-in', cell: ({ getValue }) => <span className="num text-xs">{dateTime(getValue() as string | null)}</span> },
];

function RoleChecks({ value, onChange, legend }: { value: Role[]; onChange: (r: Role[]) => void; legend: string }) {
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="text-xs font-medium text-ink-700">{legend}</legend>
      <div className="flex flex-wrap gap-3">
        {ROLES.map((r) => (
          <label key={r} className="flex items-center gap-1.5 text-sm">
            <input type="checkbox" checked={value.includes(r)} onChange={(e) => onChange(e.target.checked ? [...value, r] : value.filter((x) => x !== r))} />
            {ROLE_LABELS[r]}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function CreateUserForm({ onDone }: { onDone: () => void }) {
  const create = useCreateUser();
  const form = useForm<CreateUserInput>({ resolver: zodResolver(createUserInputSchema), defaultValues: { email: '', name: '', roles: ['engineer'], password: '' } });
  const roles = form.watch('roles');
  const e = form.formState.errors;
  const strength = usePasswordStrength(form.watch('password'), [form.watch('email'), form.watch('name')]);
  const onSubmit = form.handleSubmit((v) =>
    create.mutate(v, {
      onSuccess: (u) => {
        toast.success(`Created ${u.email}. Tell them their first password in person.`);
        onDone();
      },
      onError: (err) => {
        if (err instanceof ApiError && err.problem.errors.length) for (const x of err.problem.errors) form.setError(x.path as keyof CreateUserInput, { message: x.message });
        else toast.error(err.message);
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="New user" className="mb-6 grid grid-cols-2 gap-3 rounded border border-ink-200 bg-white p-4">
      <TextField label="Name" error={e.name?.message} {...form.register('name')} />
      <TextField label="E-mail" type="email" error={e.email?.message} {...form.register('email')} />
      <div className="flex flex-col gap-1">
        <TextField label="First password" type="password" autoComplete="new-password" hint="At least 10 characters and hard to guess; they can change it under Account." error={e.password?.message} {...form.register('password')} />
        <PasswordStrengthNote strength={strength} />
      </div>
      <div>
        <RoleChecks legend="Roles" value={roles} onChange={(r) => form.setValue('roles', r, { shouldValidate: true })} />
        {e.roles && <p role="alert" className="mt-1 text-xs text-sev-error">{e.roles.message}</p>}
      </div>
      <div className="col-span-2 flex justify-end gap-2">
        <Button variant="secondary" onClick={onDone}>Cancel</Button>
        <Button type="submit" disabled={create.isPending}>{create.isPending ? 'Creating…' : 'Create user'}</Button>
      </div>
    </form>
  );
}

function EditUser({ user, onClose }: { user: UserDto; onClose: () => void }) {
  const update = useUpdateUser();
  const reset = useResetPassword();
  const [name, setName] = useState(user.name);
  const [roles, setRoles] = useState<Role[]>(user.roles);
  const [password, setPassword] = useState('');
  const strength = usePasswordStrength(password, [user.email, user.name]);
  const save = (patch: { name?: string; roles?: Role[]; active?: boolean }) =>
    update.mutate(
      { id: user.id, version: user.version, ...patch },
      { onSuccess: () => { toast.success(`Saved ${user.email}.`); onClose(); }, onError: (err) => toast.error(err.message) },
    );
  return (
    <section aria-label={`Edit ${user.email}`} className="mb-6 flex flex-col gap-4 rounded border border-copper-300 bg-white p-4">
      <h2 className="font-semibold">{user.email}</h2>
      <div className="grid grid-cols-2 gap-3">
        <TextField label="Name" value={name} onChange={(e) => setName(e.target.value)} />
        <RoleChecks legend="Roles" value={roles} onChange={setRoles} />
      </div>
      <div className="flex flex-wrap items-end gap-2">
        <Button disabled={update.isPending || roles.length === 0 || !name.trim()} onClick={() => save({ name, roles })}>Save</Button>
        <Button variant={user.active ? 'danger' : 'secondary'} onClick={() => save({ active: !user.active })}>{user.active ? 'Deactivate' : 'Reactivate'}</Button>
        <Button variant="ghost" onClick={onClose}>Close</Button>
      </div>
      <div className="flex items-end gap-2 border-t border-ink-100 pt-3">
        <div className="flex flex-col gap-1">
          <TextField label="New password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} hint="At least 10 characters and hard to guess; signs them out everywhere." />
          <PasswordStrengthNote strength={strength} />
        </div>
        <Button
          variant="secondary"
          disabled={password.length < 10 || !strength?.ok || reset.isPending}
          onClick={() => reset.mutate({ id: user.id, password }, { onSuccess: () => { toast.success('Password reset.'); setPassword(''); }, onError: (err) => toast.error(err.message) })}
        >
          Reset password
        </Button>
      </div>
    </section>
  );
}

export default function UsersRoute() {
  const users = useUsers();
  const [creating, setCreating] = useState(false);
  const [editing, setEditing] = useState<UserDto | null>(null);
  return (
    <div className="max-w-5xl">
      <PageHeader title="Users" subtitle="Who can sign in, and with which roles" actions={!creating && <Button onClick={() => setCreating(true)}>New user</Button>} />
      {creating && <CreateUserForm onDone={() => setCreating(false)} />}
      {editing && <EditUser key={editing.id + editing.version} user={editing} onClose={() => setEditing(null)} />}
      {users.isPending ? <ProgressBar label="Loading users" /> : users.isError ? <ErrorPanel error={users.error} /> : (
        <DataTable label="Users" data={users.data} columns={columns} getRowId={(u) => u.id} onRowClick={setEditing} selectedIds={new Set(editing ? [editing.id] : [])} initialSorting={[{ id: 'name', desc: false }]} />
      )}
    </div>
  );
}
