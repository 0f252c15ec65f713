/** Where people who are not signed in are sent. */
export const SIGN_IN_PATH = '/sign-in';
