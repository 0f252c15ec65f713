/** The Sign-in protection page (one-time codes), open to every role. */
export const ACCOUNT_SECURITY_PATH = '/account/security';
