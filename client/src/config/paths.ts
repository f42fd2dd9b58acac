/** Every client route path in one place, so links and the router never drift apart. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
} as const;
