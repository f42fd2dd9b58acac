/** Every client route path in one place, so links and the router never drift apart. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  acceptInvitation: '/accept-invitation',
  members: '/members',
  devMail: '/dev/mail',
  surveys: '/surveys',
  surveyPattern: '/surveys/:surveyId',
  survey: (surveyId: string) => `/surveys/${encodeURIComponent(surveyId)}`,
  review: '/review',
  reviewSurveyPattern: '/review/:surveyId',
  reviewSurvey: (surveyId: string) => `/review/${encodeURIComponent(surveyId)}`,
} as const;
