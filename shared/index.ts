/** Types and zod schemas shared by the Angular client and the Express server. */
export * from './types/role';
export * from './types/api-error';
export * from './schemas/auth';
export * from './schemas/user';
