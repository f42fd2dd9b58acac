/** Revision history and the comparison of two revisions' results. */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { CompareResponse, RevisionsResponseSchema } from '@shared/api/review';
import { api } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export type RevisionsResponse = z.infer<typeof RevisionsResponseSchema>;

export const getRevisions = (surveyId: string) => api<RevisionsResponse>(`/api/surveys/${encodeURIComponent(surveyId)}/revisions`);
export const getCompare = (surveyId: string, a: number, b: number) =>
  api<CompareResponse>(`/api/surveys/${encodeURIComponent(surveyId)}/compare?a=${a}&b=${b}`);

export const revisionsQueryOptions = (surveyId: string) =>
  queryOptions({ queryKey: reviewKeys.revisions(surveyId), queryFn: () => getRevisions(surveyId) });
export const useRevisions = (surveyId: string) => useQuery(revisionsQueryOptions(surveyId));

export const useCompare = (surveyId: string, a: number | null, b: number | null) =>
  useQuery({
    queryKey: reviewKeys.compare(surveyId, a ?? -1, b ?? -1),
    queryFn: () => getCompare(surveyId, a!, b!),
    enabled: a !== null && b !== null && a !== b,
  });
