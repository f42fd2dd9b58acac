import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { StatusChangeRequest, StatusChangeResponseSchema } from '@shared/api/review';
import { api, jsonBody } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export type StatusChangeResponse = z.infer<typeof StatusChangeResponseSchema>;

export const changeStatus = (surveyId: string, body: StatusChangeRequest) =>
  api<StatusChangeResponse>(`/api/surveys/${encodeURIComponent(surveyId)}/status`, { method: 'POST', ...jsonBody(body) });

export function useChangeStatus(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StatusChangeRequest) => changeStatus(surveyId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.all }),
  });
}
