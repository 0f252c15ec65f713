import type { Role } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { asHiddenRefusal } from '../logging/security-events';

/** Roles that may read patient-level records and photos (DESIGN.md §2); clinicians only their own cases. */
const READ_ALL: ReadonlySet<Role> = new Set<Role>(['admin', 'audit_lead', 'partner']);
/** Roles that may register and edit clinical records; clinicians only their own cases. */
const WRITE_ALL: ReadonlySet<Role> = new Set<Role>(['audit_lead']);

/** The part of a case that decides who may touch it. */
export interface CaseOwnership {
  operatorId: number;
}

/** Who may read and write which cases. One place, so every route answers the same way. */
export const clinicalAccess = {
  /** True when the role sees every case. */
  readsAll(user: Express.User): boolean {
    return READ_ALL.has(user.role);
  },

  /** 403 for roles with no patient-level access at all (governance). */
  assertPatientLevel(user: Express.User): void {
    if (!READ_ALL.has(user.role) && user.role !== 'clinician') {
      throw HttpError.forbidden('Your role sees de-identified results only, not patient-level records.');
    }
  },

  /** 403 for roles that never write clinical records. */
  assertWriter(user: Express.User): void {
    if (!WRITE_ALL.has(user.role) && user.role !== 'clinician') {
      throw HttpError.forbidden('Your role does not record clinical data.');
    }
  },

  /** A clinician reading someone else's case gets 404: the case's existence is not theirs to know (the log still says refused). */
  assertCanRead(user: Express.User, clinicalCase: CaseOwnership): void {
    this.assertPatientLevel(user);
    if (user.role === 'clinician' && clinicalCase.operatorId !== user.id) throw asHiddenRefusal(HttpError.notFound('The case'));
  },

  assertCanWrite(user: Express.User, clinicalCase: CaseOwnership): void {
    this.assertCanRead(user, clinicalCase);
    this.assertWriter(user);
    if (user.role === 'clinician' && clinicalCase.operatorId !== user.id) throw asHiddenRefusal(HttpError.notFound('The case'));
  },
};
