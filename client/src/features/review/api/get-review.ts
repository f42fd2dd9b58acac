import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewBundle } from '@shared/api/review';
import { api } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export const getReview = (surveyId: string) => api<ReviewBundle>(`/api/review/surveys/${encodeURIComponent(surveyId)}`);

export const reviewQueryOptions = (surveyId: string) =>
  queryOptions({ queryKey: reviewKeys.detail(surveyId), queryFn: () => getReview(surveyId) });

export const useReview = (surveyId: string) => useQuery(reviewQueryOptions(surveyId));
