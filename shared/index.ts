/** Types and zod schemas shared by the Angular client and the Express server. */
export * from './types/role';
export * from './types/api-error';
export * from './schemas/auth';
export * from './schemas/user';
export * from './types/outcome-record';
export * from './types/recall-schedule';
export * from './types/clinical-terms';
export * from './types/clinical-views';
export * from './schemas/clinical-fields';
export * from './schemas/patient';
export * from './schemas/case';
export * from './schemas/visit';
export * from './schemas/complication';
export * from './schemas/photo';
