import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import type { Side } from '../../../../shared/core';
import { runResultFromJson, type RunResultJson } from '../../../../shared/pipeline';
import {
  commentSchema,
  programSchema,
  revisionDetailSchema,
  revisionSummarySchema,
  type RevisionDetail,
  waiverSchema,
  type CreateProgramInput,
  type Override,
  type RevisionSettingsInput,
  type Underlay,
  underlaysSchema,
} from '../../../../shared/schemas/program.schema';
import { api, uploadForm } from '../../../lib/api-client';

// ---- programs -------------------------------------------------------------------------------
export const getPrograms = () => api('/programs', { schema: z.object({ items: z.array(programSchema) }) }).then((r) => r.items);
export const programsQueryOptions = () => queryOptions({ queryKey: ['programs'], queryFn: getPrograms });
export const usePrograms = () => useQuery(programsQueryOptions());

export const getProgram = (id: string) => api(`/programs/${id}`, { schema: programSchema });
export const programQueryOptions = (id: string) => queryOptions({ queryKey: ['programs', id], queryFn: () => getProgram(id) });
export const useProgram = (id: string) => useQuery(programQueryOptions(id));

export function useCreateProgram() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateProgramInput) => api('/programs', { method: 'POST', body: input, schema: programSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: programsQueryOptions().queryKey }),
  });
}

export function useNewRevision(programId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(`/programs/${programId}/revisions`, { method: 'POST', schema: revisionSummarySchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: programsQueryOptions().queryKey }),
  });
}

// ---- one revision ---------------------------------------------------------------------------
export const getRevision = (id: string) => api(`/revisions/${id}`, { schema: revisionDetailSchema });
export const revisionQueryOptions = (id: string) => queryOptions({ queryKey: ['revisions', id], queryFn: () => getRevision(id) });
export const useRevision = (id: string) => useQuery(revisionQueryOptions(id));

/** One side as the engine computes it now, rebuilt into the engine's struct of arrays. */
export const getRun = (id: string, side: Side) => api(`/revisions/${id}/run?side=${side}`).then((j) => runResultFromJson(j as RunResultJson));
export const runQueryOptions = (id: string, side: Side, version: number) =>
  queryOptions({ queryKey: ['revisions', id, 'run', side, version], queryFn: () => getRun(id, side), staleTime: Infinity, retry: false });
/** With `keepPrevious`, the last result of the same side stays shown while a new version runs. */
export const useRun = (id: string, side: Side, version: number | undefined, enabled = true, keepPrevious = false) =>
  useQuery({
    ...runQueryOptions(id, side, version ?? 0),
    enabled: enabled && version !== undefined,
    placeholderData: keepPrevious ? (previous, previousQuery) => (previousQuery?.queryKey[3] === side ? previous : undefined) : undefined,
  });

/**
 * After any write, the revision and what is read with it (review summary, underlays) are read
 * again — the revision itself only when the write did not answer with it. Engine runs are keyed
 * by the revision's version: a changed revision has a new version and new runs, an unchanged one
 * keeps its runs (so a check does not run the engine twice more for the canvas).
 */
function useRevisionMutation<V>(id: string, fn: (v: V) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: async (result) => {
      const answered = !!result && typeof result === 'object' && (result as { id?: unknown }).id === id && 'settings' in result && 'state' in result;
      if (answered) qc.setQueryData(revisionQueryOptions(id).queryKey, result as RevisionDetail);
      await qc.invalidateQueries({
        predicate: (q) => {
          const k = q.queryKey;
          if (k[0] !== 'revisions' || k[1] !== id) return false;
          return k.length === 2 ? !answered : k[2] !== 'run';
        },
      });
      await qc.invalidateQueries({ queryKey: programsQueryOptions().queryKey });
    },
  });
}

export interface ImportRequest {
  file: File;
  options: RevisionSettingsInput['import'];
  version?: number;
  onProgress?: (f: number) => void;
}

function importForm(r: ImportRequest) {
  const form = new FormData();
  form.append('options', JSON.stringify(r.options ?? {}));
  if (r.version !== undefined) form.append('version', String(r.version));
  form.append('file', r.file);
  return form;
}

export const importPreviewSchema = z.object({
  fileName: z.string(),
  bytes: z.number(),
  sha256: z.string(),
  units: z.string().nullable(),
  dialect: z.record(z.string(), z.unknown()).nullable(),
  rowErrors: z.array(z.object({ line: z.number(), column: z.string().nullable(), message: z.string() })),
  truncated: z.boolean(),
  headers: z.array(z.string()),
  columns: z.record(z.string(), z.string()),
  warnings: z.array(z.object({ line: z.number().nullable(), message: z.string() })),
  rows: z.number(),
  first: z.array(z.object({ ref: z.string(), x: z.number(), y: z.number(), rotation: z.number(), side: z.string(), footprint: z.string(), value: z.string(), partNumber: z.string(), dnp: z.boolean(), line: z.number() })),
});
export type ImportPreview = z.infer<typeof importPreviewSchema>;

export function usePreviewImport(id: string) {
  return useMutation({ mutationFn: (r: ImportRequest) => uploadForm(`/revisions/${id}/centroid/preview`, importForm(r), { schema: importPreviewSchema, onProgress: r.onProgress }) });
}

export function useCommitImport(id: string) {
  return useRevisionMutation(id, (r: ImportRequest) => uploadForm(`/revisions/${id}/centroid`, importForm(r), { schema: revisionDetailSchema, onProgress: r.onProgress }));
}

export function useSaveSettings(id: string) {
  return useRevisionMutation(id, (v: { settings: RevisionSettingsInput; version: number }) => api(`/revisions/${id}/settings`, { method: 'PUT', body: v, schema: revisionDetailSchema }));
}

export function useSaveOverrides(id: string) {
  return useRevisionMutation(id, (v: { overrides: Record<string, Override>; version: number }) => api(`/revisions/${id}/overrides`, { method: 'PUT', body: v, schema: revisionDetailSchema }));
}

export function useRunChecks(id: string) {
  return useRevisionMutation(id, () => api(`/revisions/${id}/checks`, { method: 'POST', schema: revisionDetailSchema }));
}

export function useWaive(id: string) {
  return useRevisionMutation(id, (v: { key: string; reason: string; scope?: 'finding' | 'every-board' }) => api(`/revisions/${id}/waivers`, { method: 'POST', body: v, schema: waiverSchema }));
}

export function useUnwaive(id: string) {
  return useRevisionMutation(id, (waiverId: string) => api(`/revisions/${id}/waivers/${waiverId}`, { method: 'DELETE' }));
}

export function useSubmit(id: string) {
  return useRevisionMutation(id, () => api(`/revisions/${id}/submit`, { method: 'POST', schema: revisionDetailSchema }));
}

export function useApprove(id: string) {
  return useRevisionMutation(id, (comment: string) => api(`/revisions/${id}/approve`, { method: 'POST', body: { comment }, schema: revisionDetailSchema }));
}

export function useReject(id: string) {
  return useRevisionMutation(id, (comment: string) => api(`/revisions/${id}/reject`, { method: 'POST', body: { comment }, schema: revisionDetailSchema }));
}

export function useWithdraw(id: string) {
  return useRevisionMutation(id, () => api(`/revisions/${id}/withdraw`, { method: 'POST', schema: revisionDetailSchema }));
}

export function useAddComment(id: string) {
  return useRevisionMutation(id, (v: { side: Side; kind: 'comment' | 'checked'; x: number | null; y: number | null; findingKey: string | null; text: string }) =>
    api(`/revisions/${id}/comments`, { method: 'POST', body: v, schema: commentSchema }),
  );
}

export const underlayQueryOptions = (id: string) => queryOptions({ queryKey: ['revisions', id, 'underlay'], queryFn: () => api(`/revisions/${id}/underlay`, { schema: underlaysSchema }) });
export const useUnderlays = (id: string, enabled = true) => useQuery({ ...underlayQueryOptions(id), enabled });

export function useSaveUnderlay(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { side: Side; underlay: Underlay | null }) => api(`/revisions/${id}/underlay`, { method: 'PUT', body: v }),
    onSettled: () => qc.invalidateQueries({ queryKey: underlayQueryOptions(id).queryKey }),
  });
}
