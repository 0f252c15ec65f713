import * as z from 'zod';
import { ROLES } from '../types/role';

/** Sign-in request body. Length caps stop oversized input before any hashing. */
export const loginSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address.').max(254).email('Enter a valid e-mail address.'),
  password: z.string().min(1, 'Enter your password.').max(256),
});
export type LoginRequest = z.infer<typeof loginSchema>;

/** The signed-in person as the API returns them. */
export const sessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(ROLES),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** Response of `POST /api/auth/login` and `GET /api/auth/me`. */
export interface SessionResponse {
  user: SessionUser;
}
