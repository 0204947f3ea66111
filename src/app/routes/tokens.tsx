import { zodResolver } from '@hookform/resolvers/zod';
import type { ColumnDef } from '@tanstack/react-table';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { toast } from 'sonner';
import { createTokenInputSchema, type ApiTokenDto } from '../../../shared/schemas/program.schema';
import { Button } from '../../components/ui/button';
import { DataTable } from '../../components/ui/data-table';
import { TextField } from '../../components/ui/field';
import { Badge, ErrorPanel, PageHeader, ProgressBar } from '../../components/ui/misc';
import { useRunFiles } from '../../features/run-files/api/run-files';
import { CopyButton } from '../../features/run-files/components/copy-button';
import { useCreateToken, useRevokeToken, useTokens, type CreatedToken, type CreateTokenInput } from '../../features/tokens/api/tokens';
import { ApiError } from '../../lib/api-client';
import { dateTime } from '../../lib/format';

const origin = () => (typeof window === 'undefined' ? 'http://localhost:3000' : window.location.origin);

function CreateTokenForm({ onCreated, onCancel }: { onCreated: (t: CreatedToken) => void; onCancel: () => void }) {
  const create = useCreateToken();
  const form = useForm<CreateTokenInput>({ resolver: zodResolver(createTokenInputSchema), defaultValues: { name: '' } });
  const onSubmit = form.handleSubmit((v) =>
    create.mutate(v, {
      onSuccess: (t) => onCreated(t),
      onError: (err) => {
        const field = err instanceof ApiError ? err.fieldError('name') : undefined;
        if (field) form.setError('name', { message: field });
        else toast.error(err.message);
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="New line token" className="mb-6 flex items-start gap-3 rounded border border-ink-200 bg-white p-4">
      <TextField
        className="w-96"
        label="Name"
        placeholder="Line B loader PC"
        hint="Which computer or script will use it, so you know what to revoke later."
        error={form.formState.errors.name?.message}
        {...form.register('name')}
      />
      <div className="flex gap-2 pt-5">
        <Button type="submit" disabled={create.isPending}>{create.isPending ? 'Creating…' : 'Create token'}</Button>
        <Button variant="secondary" onClick={onCancel}>Cancel</Button>
      </div>
    </form>
  );
}

function NewTokenPanel({ created, onClose }: { created: CreatedToken; onClose: () => void }) {
  // A real download URL when something is released (the newest current release), else its shape.
  const runFiles = useRunFiles();
  const current = runFiles.data?.find((r) => r.state === 'released' && r.files.some((f) => f.side === 'top' && f.format === 'csv'));
  const url = `${origin()}${current ? current.files.find((f) => f.side === 'top' && f.format === 'csv')!.url : '/api/run-files/<revision-id>/top.csv'}`;
  const curl = `curl -fsS -H "Authorization: Bearer ${created.token}" -OJ "${url}"`;
  return (
    <section aria-label="New token" className="mb-6 rounded border-2 border-copper-400 bg-copper-50 p-4">
      <h2 className="font-semibold text-ink-900">Token for {created.item.name}</h2>
      <p className="mt-1 text-sm font-medium text-copper-800">Copy it now: it is shown this once and cannot be shown again. Placewright keeps only its hash.</p>
      <div className="mt-2 flex items-center gap-2 rounded border border-ink-300 bg-white px-3 py-2">
        <code className="num break-all text-sm" data-testid="new-token">{created.token}</code>
        <CopyButton text={created.token} label="Copy the token" />
      </div>
      <div className="mt-3 text-sm text-ink-700">
        <p>
          The line computer sends it as <code className="num rounded bg-white px-1">Authorization: Bearer &lt;token&gt;</code> on the run-file download URLs{' '}
          <code className="num rounded bg-white px-1">/api/run-files/&lt;revision-id&gt;/top.csv</code> (also <code className="num">top.json</code>, <code className="num">bottom.csv</code>,{' '}
          <code className="num">bottom.json</code>) and nowhere else: it cannot sign in, list programs or change anything. The answer’s <code className="num">X-Content-SHA256</code> header carries the file’s checksum. Copy a revision’s download link from the Run files page.
        </p>
        <p className="mt-2 text-xs font-medium text-ink-600">
          For example{current ? <>, the top CSV of {current.programName} {current.label}</> : null}:
        </p>
        <div className="mt-1 flex items-start gap-2 rounded bg-ink-900 px-3 py-2">
          <code className="num break-all text-xs text-ink-100">{curl}</code>
          <CopyButton text={curl} label="Copy the example command" />
        </div>
      </div>
      <Button className="mt-3" variant="secondary" onClick={onClose}>I have stored it</Button>
    </section>
  );
}

function RevokeButton({ token }: { token: ApiTokenDto }) {
  const revoke = useRevokeToken();
  const [confirming, setConfirming] = useState(false);
  if (token.revokedAt) return null;
  if (!confirming) return <Button variant="ghost" onClick={() => setConfirming(true)}>Revoke…</Button>;
  return (
    <span role="group" aria-label={`Revoke ${token.name}?`} className="inline-flex items-center gap-2 text-xs">
      <span className="text-ink-700">Downloads with it stop at once.</span>
      <Button
        variant="danger"
        disabled={revoke.isPending}
        onClick={() =>
          revoke.mutate(token.id, {
            onSuccess: () => toast.success(`Revoked ${token.name}.`),
            onError: (err) => toast.error(err.message),
            onSettled: () => setConfirming(false),
          })
        }
      >
        Revoke
      </Button>
      <Button variant="ghost" onClick={() => setConfirming(false)}>Keep</Button>
    </span>
  );
}

const columns: ColumnDef<ApiTokenDto, any>[] = [
  { accessorKey: 'name', header: 'Name', cell: ({ row }) => <span className={row.original.revokedAt ? 'text-ink-400 line-through' : 'font-medium'}>{row.original.name}</span> },
  { accessorKey: 'prefix', header: 'Starts with', cell: ({ getValue }) => <code className="num text-xs">{getValue() as string}…</code> },
  { accessorKey: 'createdAt', header: 'Created', cell: ({ getValue }) => <span className="num text-xs">{dateTime(getValue() as string)}</span> },
  { accessorKey: 'lastUsedAt', header: 'Last used', cell: ({ getValue }) => <span className="num text-xs">{getValue() ? dateTime(getValue() as string) : 'never'}</span> },
  {
    accessorKey: 'revokedAt',
    header: 'Status',
    cell: ({ getValue }) => (getValue() ? <span className="flex items-center gap-2"><Badge>revoked</Badge><span className="num text-xs text-ink-500">{dateTime(getValue() as string)}</span></span> : <Badge tone="mask">active</Badge>),
  },
  { id: 'actions', header: '', enableSorting: false, cell: ({ row }) => <RevokeButton token={row.original} /> },
];

export default function TokensRoute() {
  const tokens = useTokens();
  const [creating, setCreating] = useState(false);
  const [created, setCreated] = useState<CreatedToken | null>(null);
  return (
    <div className="max-w-5xl">
      <PageHeader
        title="Line access"
        subtitle="Read-only tokens with which a line computer downloads released run files, without a person signing in"
        actions={!creating && !created && <Button onClick={() => setCreating(true)}>New token</Button>}
      />
      {creating && (
        <CreateTokenForm
          onCreated={(t) => {
            setCreating(false);
            setCreated(t);
          }}
          onCancel={() => setCreating(false)}
        />
      )}
      {created && <NewTokenPanel created={created} onClose={() => setCreated(null)} />}
      {tokens.isPending ? (
        <ProgressBar label="Loading tokens" />
      ) : tokens.isError ? (
        <ErrorPanel error={tokens.error} />
      ) : (
        <DataTable label="Line tokens" data={tokens.data} columns={columns} getRowId={(t) => t.id} empty="No tokens yet. Create one for each line computer that fetches run files." />
      )}
    </div>
  );
}
