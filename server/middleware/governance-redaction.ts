import type { RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import { Patient } from '../entities/patient.entity';
import { freeTextRedactor } from '../export/free-text-redactor';

/**
 * Fields of the audit views that hold text the team typed (audit title and rationale, a
 * standard's criterion, evidence and exceptions, cycle notes, action items). People write
 * patient codes and days into them; everything else in those views is computed or chosen
 * from lists.
 */
const TEAM_TEXT_KEYS: ReadonlySet<string> = new Set(['title', 'rationale', 'criterion', 'evidenceSource', 'exceptions', 'notes', 'action']);

/** Redacts team-written text wherever it sits in a JSON body; other values pass unchanged. */
export function redactTeamText(value: unknown, redact: (text: string) => string, key = ''): unknown {
  if (typeof value === 'string') return TEAM_TEXT_KEYS.has(key) ? redact(value) : value;
  if (Array.isArray(value)) return value.map((item) => redactTeamText(item, redact, key));
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([childKey, child]) => [childKey, redactTeamText(child, redact, childKey)]));
  }
  return value;
}

/**
 * The governance committee sees de-identified results (DESIGN.md §2, §7): on the audit routes,
 * its JSON answers carry team-written text redacted exactly as the governance workbook redacts
 * it (no patient code of the practice; full dates cut to the month). Other roles are untouched.
 */
export function governanceRedaction(dataSource: DataSource): RequestHandler {
  return (req, res, next) => {
    if (req.user?.role !== 'governance') return next();
    dataSource
      .getRepository(Patient)
      .find({ select: { code: true } })
      .then((patients) => {
        const redact = freeTextRedactor(patients.map((patient) => patient.code));
        const send = res.json.bind(res);
        res.json = (body?: unknown) => send(redactTeamText(body, redact));
        next();
      })
      .catch(next);
  };
}
