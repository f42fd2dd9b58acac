import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SetVerdict, Verdict } from '@shared/api/review';
import { api, jsonBody } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export const setVerdict = (surveyId: string, body: SetVerdict) =>
  api<Verdict>(`/api/review/surveys/${encodeURIComponent(surveyId)}/verdicts`, { method: 'PUT', ...jsonBody(body) });

export function useSetVerdict(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SetVerdict) => setVerdict(surveyId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}
