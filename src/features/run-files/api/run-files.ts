import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { problemReportInputSchema, runFileSchema } from '../../../../shared/schemas/program.schema';
import { setupSheetSchema } from '../../../../shared/schemas/run-file.schema';
import { api } from '../../../lib/api-client';

const runFileListSchema = z.object({ items: z.array(runFileSchema) });

export const getRunFiles = () => api('/run-files', { schema: runFileListSchema }).then((r) => r.items);
export const runFilesQueryOptions = () => queryOptions({ queryKey: ['run-files'], queryFn: getRunFiles });
export const useRunFiles = () => useQuery(runFilesQueryOptions());

export const getSetupSheet = (revisionId: string) => api(`/run-files/${revisionId}/setup-sheet`, { schema: setupSheetSchema });
export const setupSheetQueryOptions = (revisionId: string) =>
  queryOptions({ queryKey: [...runFilesQueryOptions().queryKey, revisionId, 'setup-sheet'], queryFn: () => getSetupSheet(revisionId) });
export const useSetupSheet = (revisionId: string) => useQuery(setupSheetQueryOptions(revisionId));

export type ProblemReportInput = z.infer<typeof problemReportInputSchema>;

/** Sends a problem report to the program's author; it changes nothing in the list, so no invalidation. */
export function useReportProblem(revisionId: string) {
  return useMutation({
    mutationFn: (input: ProblemReportInput) => api(`/run-files/${revisionId}/problems`, { method: 'POST', body: input, schema: z.object({ ok: z.literal(true) }) }),
  });
}
