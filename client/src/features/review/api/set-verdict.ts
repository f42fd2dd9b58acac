import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SetVerdict, Verdict } from '@shared/api/review';
import { api, jsonBody } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export const setVerdict = (surveyId: string, body: SetVerdict) =>
  api<Verdict>(`/api/review/surveys/${encodeURIComponent(surveyId)}/verdicts`, { method: 'PUT', ...jsonBody(body) });

/**
 * `target` names what the verdict is on (a boundary id or 'survey'): saves of one target run one after
 * another (TanStack Query's mutation scope), so a verdict and the note typed right after it reach the
 * server in that order.
 */
export function useSetVerdict(surveyId: string, target: string) {
  const qc = useQueryClient();
  return useMutation({
    scope: { id: `verdict:${surveyId}:${target}` },
    mutationFn: (body: SetVerdict) => setVerdict(surveyId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}
