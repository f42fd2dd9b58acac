/** Adding and removing operating limits. */
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NewLimit, OperatingLimit } from '@shared/api/review';
import { api, jsonBody } from '@client/lib/api-client';
import { reviewKeys } from './keys';

const base = (surveyId: string) => `/api/review/surveys/${encodeURIComponent(surveyId)}/limits`;

export const addLimit = (surveyId: string, body: NewLimit) => api<OperatingLimit>(base(surveyId), { method: 'POST', ...jsonBody(body) });
export const removeLimit = (surveyId: string, limitId: string) =>
  api<void>(`${base(surveyId)}/${encodeURIComponent(limitId)}`, { method: 'DELETE' });

export function useAddLimit(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: NewLimit) => addLimit(surveyId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}

export function useRemoveLimit(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (limitId: string) => removeLimit(surveyId, limitId),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}
