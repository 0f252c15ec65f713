import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { auditFixture } from '../testing/report-fixtures';
import { CommitteeNotice, noticeOutcome } from './committee-notice';

const AUDIT = auditFixture();

describe('CommitteeNotice', () => {
  let fixture: ComponentFixture<CommitteeNotice>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(CommitteeNotice);
    fixture.componentRef.setInput('scope', { audit: AUDIT, cycle: AUDIT.cycles[0] ?? null });
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;

  async function openConfirmation(): Promise<MatDialogHarness> {
    await (await loader.getHarness(MatButtonHarness.with({ text: /Tell the committee/ }))).click();
    return documentLoader.getHarness(MatDialogHarness);
  }

  it('says the mail carries a sign-in link and no patient data before anything is sent', async () => {
    const dialog = await openConfirmation();
    expect(await dialog.getTitleText()).toContain('Tell the committee?');
    const text = await dialog.getContentText();
    expect(text).toContain('sign-in link');
    expect(text).toContain('no patient data');
    expect(text).toContain('(cycle 1)');
    http.expectNone('/api/audits/12/send-pack');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Cancel' }))).click();
    http.expectNone('/api/audits/12/send-pack');
  });

  it('sends for the chosen cycle once confirmed and reports how many members were written to', async () => {
    const dialog = await openConfirmation();
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send the e-mail' }))).click();
    const request = http.expectOne('/api/audits/12/send-pack');
    expect(request.request.body).toEqual({ cycleId: 71 });
    request.flush({ queued: 3 }, { status: 202, statusText: 'Accepted' });
    await fixture.whenStable();
    expect(element().querySelector('[role="status"]')?.textContent).toContain('Sent to 3 committee members.');
  });

  it("shows a refusal in the server's words", async () => {
    const dialog = await openConfirmation();
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send the e-mail' }))).click();
    http
      .expectOne('/api/audits/12/send-pack')
      .flush({ error: { code: 'forbidden', message: 'The audit lead sends the governance pack.' } }, { status: 403, statusText: 'Forbidden' });
    await fixture.whenStable();
    expect(element().querySelector('[role="alert"]')?.textContent).toContain('The audit lead sends the governance pack.');
  });

  it('words the outcome for one member and for an empty committee', () => {
    expect(noticeOutcome(1)).toBe('Sent to 1 committee member.');
    expect(noticeOutcome(0)).toContain('no active governance committee member');
  });
});
