import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CommentResolution, NewComment, ReviewComment } from '@shared/api/review';
import { api, jsonBody } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export const addComment = (surveyId: string, body: NewComment) =>
  api<ReviewComment>(`/api/review/surveys/${encodeURIComponent(surveyId)}/comments`, { method: 'POST', ...jsonBody(body) });

export function useAddComment(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: NewComment) => addComment(surveyId, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}

export const resolveComment = (surveyId: string, commentId: string, body: CommentResolution) =>
  api<ReviewComment>(`/api/review/surveys/${encodeURIComponent(surveyId)}/comments/${encodeURIComponent(commentId)}/resolution`, { method: 'PUT', ...jsonBody(body) });

/** The engineer closes an answered thread, or opens it again. */
export function useResolveComment(surveyId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ commentId, resolved }: { commentId: string; resolved: boolean }) => resolveComment(surveyId, commentId, { resolved }),
    onSuccess: () => qc.invalidateQueries({ queryKey: reviewKeys.detail(surveyId) }),
  });
}
