// Every client route path in one place.
export const paths = {
  home: '/',
  signIn: '/sign-in',
  resetPassword: '/reset-password',
  setPassword: (token = ':token') => `/set-password/${token}`,
  people: '/people',
  outbox: '/people/outbox',
  notAllowed: '/not-allowed',
  faultLocator: '/fault-locator',
  verify: (number = ':number') => `/verify/${number}`,
} as const;
