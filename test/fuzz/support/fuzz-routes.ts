import { ACCOUNT_ROUTES } from './account-routes';
import { AUDIT_ROUTES } from './audit-routes';
import { CLINICAL_ROUTES } from './clinical-routes';
import type { FuzzRoute } from './fuzz-route';

/** Every write route under /api, with what the fuzz needs to make each request certainly invalid. */
export const FUZZ_ROUTES: readonly FuzzRoute[] = [...ACCOUNT_ROUTES, ...CLINICAL_ROUTES, ...AUDIT_ROUTES];
