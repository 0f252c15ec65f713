import type { CaseDetail, PatientView, ReviewNoteView } from '@tidemark/shared';
import { auditBody, createAudit, defaultScheduleId } from '../support/audit-fixtures';
import { createCase, createClinicalWorld, expectStatus, patientBody, type ClinicalWorld } from '../support/clinical-fixtures';
import { queryRows } from '../support/test-database';

/*
 * Decoding and encoding (OWASP ASVS 5.0 1.1.1 and 1.1.2). Input is decoded once, by Express
 * (path parameters: decodeURIComponent), qs (query strings) and JSON.parse (bodies), then checked
 * by zod; nothing decodes again later. Output is encoded at the last step: text is stored as typed
 * and the JSON writer (res.json) is what encodes it; the browser's template binding does the same
 * for HTML (see src/app/features/audits/review-notes/review-notes-as-text.spec.ts).
 */

/** A percent sign written as %25 first, then each byte of `text` percent-encoded: one decoding gives `%XX…`, two give `text` (RFC 3986 §2.1). */
function doubleEncoded(text: string): string {
  return [...Buffer.from(text, 'utf8')].map((byte) => `%25${byte.toString(16).toUpperCase().padStart(2, '0')}`).join('');
}

/** Each byte percent-encoded once (RFC 3986 §2.1). */
function onceEncoded(text: string): string {
  return [...Buffer.from(text, 'utf8')].map((byte) => `%${byte.toString(16).toUpperCase().padStart(2, '0')}`).join('');
}

const MARKUP = '<img src=x onerror=alert(1)>';
/** Text that looks encoded: percent escapes and HTML entities, which must stay as typed. */
const LOOKS_ENCODED = '50%25 of %3Cb%3E and &lt;i&gt; and &amp;lt;';

describe('input decoded once, before validation (ASVS 5.0 1.1.1)', () => {
  let w: ClinicalWorld;
  let patient: PatientView;

  beforeAll(async () => {
    w = await createClinicalWorld();
    patient = expectStatus(await w.as('audit_lead').post('/api/patients', patientBody({ code: 'DE-0042' })), 201).body as PatientView;
  });
  afterAll(async () => {
    await w.close();
  });

  it('reads a double-encoded query value as the once-decoded text, never as the patient code it decodes to twice', async () => {
    const lead = w.as('audit_lead');
    const codes = async (query: string) => (expectStatus(await lead.get(`/api/patients?code=${query}`), 200).body as PatientView[]).map((found) => found.code);
    expect(await codes('DE-0042')).toEqual(['DE-0042']);
    // The hyphen once-encoded (%2D): qs decodes it to DE-0042.
    expect(await codes('DE%2D0042')).toEqual(['DE-0042']);
    // The hyphen twice-encoded (%252D): qs gives "DE%2D0042", which is not the code; only a second decoding would find the patient.
    expect(await codes('DE%252D0042')).toEqual([]);
    const cases = async (query: string) => (expectStatus(await lead.get(`/api/cases?patientCode=${query}`), 200).body as { total: number }).total;
    expect(await cases('DE%2D0042')).toBe(0);
    await createCase(lead, w.ids.clinician, { patientId: patient.id, patient: undefined });
    expect(await cases('DE%2D0042')).toBe(1);
    expect(await cases('DE%252D0042')).toBe(0);
  });

  it('refuses a double-encoded record id in the path (400), while the once-encoded id reads the record', async () => {
    const lead = w.as('audit_lead');
    const once = await lead.get(`/api/patients/${onceEncoded(String(patient.id))}`);
    expect(once.status).toBe(200);
    expect((once.body as PatientView).code).toBe('DE-0042');
    const twice = await lead.get(`/api/patients/${doubleEncoded(String(patient.id))}`);
    expect(twice.status).toBe(400);
    expect(twice.body.error.code).toBe('validation');
  });

  it('keeps percent escapes and HTML entities in a JSON body as typed, never unescaping them later', async () => {
    const lead = w.as('audit_lead');
    const created = await createCase(lead, w.ids.clinician, { notes: LOOKS_ENCODED });
    expect(created.notes).toBe(LOOKS_ENCODED);
    const [row] = await queryRows<{ notes: string }>(w.t.dataSource, 'SELECT notes FROM surgical_case WHERE id = :id', { id: created.id });
    expect(row.notes).toBe(LOOKS_ENCODED);
    expect((expectStatus(await lead.get(`/api/cases/${created.id}`), 200).body as CaseDetail).notes).toBe(LOOKS_ENCODED);
  });
});

describe('output encoded at the last step, by the JSON writer (ASVS 5.0 1.1.2)', () => {
  let w: ClinicalWorld;

  beforeAll(async () => {
    w = await createClinicalWorld();
  });
  afterAll(async () => {
    await w.close();
  });

  it('stores a case note holding markup as typed and answers it as JSON text, not as a page', async () => {
    const lead = w.as('audit_lead');
    const created = await createCase(lead, w.ids.clinician, { notes: MARKUP });
    const [row] = await queryRows<{ notes: string }>(w.t.dataSource, 'SELECT notes FROM surgical_case WHERE id = :id', { id: created.id });
    // Not HTML-escaped on the way in: encoding belongs to whatever shows the text.
    expect(row.notes).toBe(MARKUP);
    const response = expectStatus(await lead.get(`/api/cases/${created.id}`), 200);
    expect((response.body as CaseDetail).notes).toBe(MARKUP);
    // A JSON document a browser will not sniff into HTML (RFC 8259 §11; Fetch standard, X-Content-Type-Options).
    expect(response.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.text).toContain(`"notes":${JSON.stringify(MARKUP)}`);
  });

  it('stores a review note holding markup as typed and lists it verbatim', async () => {
    const lead = w.as('audit_lead');
    const audit = await createAudit(lead, auditBody(await defaultScheduleId(lead)));
    const text = `Check ${MARKUP} & the "drift" chart`;
    const saved = expectStatus(await w.as('partner').post(`/api/audits/${audit.id}/notes`, { topic: 'chart:funnel', text }), 201).body as ReviewNoteView;
    expect(saved.text).toBe(text);
    const [row] = await queryRows<{ text: string }>(w.t.dataSource, 'SELECT text FROM review_note WHERE id = :id', { id: saved.id });
    expect(row.text).toBe(text);
    const listed = expectStatus(await lead.get(`/api/audits/${audit.id}/notes`), 200).body as ReviewNoteView[];
    expect(listed.map((note) => note.text)).toEqual([text]);
  });
});
