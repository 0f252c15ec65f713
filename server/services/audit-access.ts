import { HttpError } from '../http-error';

/** Audits are designed by the audit lead (DESIGN.md §2). */
export function assertAuditWriter(user: Express.User): void {
  if (user.role !== 'audit_lead') throw HttpError.forbidden('Only the audit lead defines audits, schedules, standards and cycles.');
}

/** Dashboards: audit lead, partners, governance (de-identified) and clinicians (own results + anonymised peers). */
export function assertAuditReader(user: Express.User): void {
  if (user.role === 'admin') throw HttpError.forbidden('Audit results are for the clinical team and the governance committee.');
}

/** Review notes: written and read by partners and the audit lead. */
export function assertNoteReader(user: Express.User): void {
  if (user.role !== 'audit_lead' && user.role !== 'partner') throw HttpError.forbidden('Review notes are for partners and the audit lead.');
}
