/** Issuing and revoking master's brief links. */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { BriefLink, IssueBrief, IssueBriefResponseSchema } from '@shared/api/review';
import { api, jsonBody } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export type IssueBriefResponse = z.infer<typeof IssueBriefResponseSchema>;

export const issueBrief = (surveyId: string, body: IssueBrief) =>
  api<IssueBriefResponse>(`/api/review/surveys/${encodeURIComponent(surveyId)}/briefs`, { method: 'POST', ...jsonBody(body) });
export const revokeBrief = (briefId: string) => api<BriefLink>(`/api/review/briefs/${encodeURIComponent(briefId)}/revoke`, { method: 'POST' });

export function useIssueBrief(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: IssueBrief) => issueBrief(surveyId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}

export function useRevokeBrief(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (briefId: string) => revokeBrief(briefId),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}
