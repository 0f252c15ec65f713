import type { SessionUser } from '@tidemark/shared';

/** The signed-in person as the API shows them: exactly the public fields, whatever else `req.user` carries. */
export function sessionUser(user: Express.User): SessionUser {
  return { id: user.id, email: user.email, displayName: user.displayName, role: user.role };
}
