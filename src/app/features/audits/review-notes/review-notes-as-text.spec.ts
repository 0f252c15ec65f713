import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { ReviewNoteView } from '@tidemark/shared';
import { auditFixture } from '../testing/audit-fixture';
import { ReviewNotes } from './review-notes';

/*
 * Team-written text is shown as text, never as HTML (OWASP ASVS 5.0 1.2.1 and 3.2.2): Angular's
 * interpolation sets textContent, so markup a colleague typed into a review note (stored and
 * answered verbatim by the API, see test/api/security/input-output-encoding.api.spec.ts) appears
 * as the characters typed and creates no element, attribute or handler.
 */

const MARKUP = '<img src=x onerror=alert(1)><b>bold</b><script>alert(2)</script>';

function noteOf(id: number, text: string): ReviewNoteView {
  return { id, auditId: 12, cycleId: null, topic: 'audit', text, author: { id: 9, displayName: '<i>Pat</i> Spec' }, createdAt: '2030-01-02T09:00:00.000Z' };
}

describe('ReviewNotes shows team-written text as text', () => {
  let fixture: ComponentFixture<ReviewNotes>;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReviewNotes);
    fixture.componentRef.setInput('audit', auditFixture());
    await fixture.whenStable();
    http.expectOne('/api/audits/12/notes').flush([noteOf(1, MARKUP)]);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  it('renders a note holding markup as the characters typed, creating no element from it', () => {
    const item = (fixture.nativeElement as HTMLElement).querySelector('li');
    expect(item).not.toBeNull();
    const paragraphs = item?.querySelectorAll('p') ?? [];
    // The note's paragraph holds exactly one text node: the markup as written.
    const text = paragraphs[paragraphs.length - 1];
    expect(text.textContent).toBe(MARKUP);
    expect(text.childNodes).toHaveLength(1);
    expect(text.firstChild?.nodeType).toBe(Node.TEXT_NODE);
    expect(item?.querySelector('img, b, i, script')).toBeNull();
    expect(item?.querySelector('strong')?.textContent).toBe('<i>Pat</i> Spec');
    expect((fixture.nativeElement as HTMLElement).querySelectorAll('[onerror], img, script')).toHaveLength(0);
  });
});
