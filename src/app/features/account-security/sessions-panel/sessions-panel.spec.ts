import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import type { OwnSession } from '@tidemark/shared';
import { SessionsPanel, endedOthersSentence } from './sessions-panel';

const HERE: OwnSession = { id: 'hereHandle000000000000', device: 'Firefox on Linux', signedInAt: '2026-12-02T08:00:00.000Z', lastActiveAt: '2026-12-02T09:00:00.000Z', isCurrent: true };
const TABLET: OwnSession = { id: 'tabletHandle0000000000', device: 'Safari on iOS', signedInAt: '2026-12-01T07:30:00.000Z', lastActiveAt: '2026-12-01T12:15:00.000Z', isCurrent: false };

describe('SessionsPanel', () => {
  let fixture: ComponentFixture<SessionsPanel>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function render(sessions: OwnSession[]): Promise<void> {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SessionsPanel);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne('/api/auth/sessions').flush(sessions);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const items = (): string[] => [...(fixture.nativeElement as HTMLElement).querySelectorAll('li.session')].map((item) => item.textContent?.replace(/\s+/g, ' ').trim() ?? '');

  it('lists each session with its browser, marks this one, and offers End only for the others', async () => {
    await render([HERE, TABLET]);
    expect(items()).toHaveLength(2);
    expect(items()[0]).toMatch(/^computer Firefox on Linux This browser Signed in .+ · last active .+$/);
    expect(items()[1]).toMatch(/^devices_other Safari on iOS Signed in .+ · last active .+ End$/);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: 'End' }))).toHaveLength(1);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Sign out everywhere else/ }))).toHaveLength(1);
  });

  it('offers no "everywhere else" when this is the only session', async () => {
    await render([HERE]);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Sign out everywhere else/ }))).toHaveLength(0);
  });

  it('ends one session by its handle, says so and reads the list again', async () => {
    await render([HERE, TABLET]);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'End' }))).click();
    const request = http.expectOne(`/api/auth/sessions/${TABLET.id}`);
    expect(request.request.method).toBe('DELETE');
    request.flush(null, { status: 204, statusText: 'No Content' });
    http.expectOne('/api/auth/sessions').flush([HERE]);
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('Ended the session of Safari on iOS.');
    expect(items()).toHaveLength(1);
  });

  it('ends all the others at once and says how many', async () => {
    await render([HERE, TABLET]);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Sign out everywhere else/ }))).click();
    const request = http.expectOne('/api/auth/sessions/end-others');
    expect(request.request.method).toBe('POST');
    request.flush({ endedSessions: 1 });
    http.expectOne('/api/auth/sessions').flush([HERE]);
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('Signed out of 1 other session.');
  });

  it('words the outcome for none, one and several', () => {
    expect(endedOthersSentence(0)).toBe('There were no other sessions to end.');
    expect(endedOthersSentence(1)).toBe('Signed out of 1 other session.');
    expect(endedOthersSentence(4)).toBe('Signed out of 4 other sessions.');
  });
});
