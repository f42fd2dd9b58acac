/** Query keys of the review desk; invalidate by prefix. */
export const reviewKeys = {
  all: ['review'] as const,
  queue: () => [...reviewKeys.all, 'queue'] as const,
  detail: (surveyId: string) => [...reviewKeys.all, 'survey', surveyId] as const,
  revisions: (surveyId: string) => [...reviewKeys.detail(surveyId), 'revisions'] as const,
  compare: (surveyId: string, a: number, b: number) => [...reviewKeys.detail(surveyId), 'compare', a, b] as const,
};
