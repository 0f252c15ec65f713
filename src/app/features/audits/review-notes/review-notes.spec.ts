import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { ReviewNoteView } from '@tidemark/shared';
import { auditFixture } from '../testing/audit-fixture';
import { ReviewNotes } from './review-notes';

describe('ReviewNotes', () => {
  let fixture: ComponentFixture<ReviewNotes>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReviewNotes);
    fixture.componentRef.setInput('audit', auditFixture());
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    http.expectOne('/api/audits/12/notes').flush([]);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const note = async () => (await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Note' })));
  const addNote = async () => (await loader.getHarness(MatButtonHarness.with({ text: /Add note/ }))).click();

  it('lists the added note and leaves an empty note field without an error', async () => {
    await (await loader.getHarness(MatInputHarness.with({ selector: 'textarea' }))).setValue('Look at the thin-phenotype drift before the meeting.');
    await addNote();
    const request = http.expectOne('/api/audits/12/notes');
    expect(request.request.body).toEqual({ topic: 'audit', cycleId: null, text: 'Look at the thin-phenotype drift before the meeting.' });
    const saved: ReviewNoteView = {
      id: 3,
      auditId: 12,
      cycleId: null,
      topic: 'audit',
      text: request.request.body.text,
      author: { id: 9, displayName: 'Pat Spec' },
      createdAt: '2030-01-02T09:00:00.000Z',
    };
    request.flush(saved);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).querySelector('li')?.textContent).toContain('Look at the thin-phenotype drift');
    // The form was submitted once; the emptied field must not greet the next note in red.
    expect(await (await note()).hasErrors()).toBe(false);
    expect(await (await note()).isControlValid()).toBe(false);
  });

  it('says what is missing when an empty note is sent', async () => {
    await addNote();
    http.expectNone('/api/audits/12/notes');
    expect(await (await note()).getTextErrors()).toEqual(['Write the note.']);
  });
});
