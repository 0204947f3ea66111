import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { proposalSchema, type ApproveProposalInput, type ProposalInput } from '../../../../shared/schemas/library.schema';
import { api } from '../../../lib/api-client';
import { useInvalidateLibrary } from './packages';

export const getProposals = () => api('/library/proposals', { schema: z.object({ items: z.array(proposalSchema) }) }).then((r) => r.items);
export const proposalsQueryOptions = () => queryOptions({ queryKey: ['library', 'proposals'], queryFn: getProposals });
export const useProposals = () => useQuery(proposalsQueryOptions());

export function useCreateProposal() {
  const invalidate = useInvalidateLibrary();
  return useMutation({ mutationFn: (input: ProposalInput) => api('/library/proposals', { method: 'POST', body: input, schema: proposalSchema }), onSuccess: invalidate });
}

export function useDecideProposal() {
  const invalidate = useInvalidateLibrary();
  return useMutation({
    mutationFn: ({ id, decision, ...body }: ApproveProposalInput & { id: string; decision: 'approve' | 'reject' }) =>
      api(`/library/proposals/${id}/${decision}`, { method: 'POST', body, schema: proposalSchema }),
    onSuccess: invalidate,
  });
}
