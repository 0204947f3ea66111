import { queryOptions, useQuery } from '@tanstack/react-query';
import { reviewSummarySchema } from '../../../../shared/schemas/program.schema';
import { api } from '../../../lib/api-client';

/** What a reviewer approves: findings by kind with waivers, overrides, changes since the last release. */
export const getReviewSummary = (id: string) => api(`/revisions/${id}/review-summary`, { schema: reviewSummarySchema });
// under ['revisions', id]: every write to the revision invalidates it with the revision
export const reviewSummaryQueryOptions = (id: string) => queryOptions({ queryKey: ['revisions', id, 'review-summary'], queryFn: () => getReviewSummary(id) });
export const useReviewSummary = (id: string) => useQuery(reviewSummaryQueryOptions(id));
