import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import type { OutboxEntry } from '../outbox-entry';
import { outboxStatusLook } from '../outbox-status-badge/outbox-status-badge';
import { OutboxPage } from './outbox-page';

function entry(overrides: Partial<OutboxEntry>): OutboxEntry {
  return {
    id: 1,
    kind: 'governance-pack',
    to: 'committee@example.org',
    subject: 'Tidemark: governance pack ready — Spec audit',
    body: 'Dear Kit,\n\nSign in to download it: http://localhost/reports',
    status: 'sent',
    attempts: 1,
    lastError: null,
    nextAttemptAt: null,
    sentAt: '2026-03-02T10:01:00.000Z',
    createdAt: '2026-03-02T10:00:00.000Z',
    ...overrides,
  };
}

const MESSAGES: OutboxEntry[] = [
  entry({ id: 3, kind: 'recall-digest', to: 'wren@example.org', subject: 'Tidemark: 2 recalls in their window, 0 overdue', status: 'failed', attempts: 5, lastError: 'Connection refused', sentAt: null }),
  entry({ id: 2, kind: 'action-reminder', to: 'aiko@example.org', subject: 'Tidemark: action due on 2026-03-10', status: 'queued', attempts: 2, lastError: 'Greeting never received', nextAttemptAt: '2026-03-02T10:20:00.000Z', sentAt: null }),
  entry({ id: 1 }),
];

describe('OutboxPage', () => {
  let fixture: ComponentFixture<OutboxPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(OutboxPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne('/api/outbox').flush(MESSAGES);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;

  async function column(name: string): Promise<string[]> {
    const table = await loader.getHarness(MatTableHarness);
    return table.getCellTextByColumnName().then((columns) => columns[name]?.text ?? []);
  }

  it('shows kind in our words and state as icon and word', async () => {
    const messages = await column('message');
    expect(messages[0]).toMatch(/^Weekly recall round-up/);
    expect(messages[1]).toMatch(/^Action plan nudge/);
    expect(messages[2]).toMatch(/^Committee pack notice/);
    expect(await column('status')).toEqual(['unsubscribeFailed', 'schedule_sendWaiting to retry', 'mark_email_readSent']);
    expect(await column('attempts')).toEqual(['5', '2', '1']);
    expect(await column('lastError')).toEqual(['Connection refused', 'Greeting never received', '—']);
    expect((await column('times'))[1]).toContain('Next try');
    expect(element().textContent).toContain('2 not delivered yet.');
  });

  it('names a never-tried queued message differently from a retry', () => {
    expect(outboxStatusLook({ status: 'queued', attempts: 0 }).word).toBe('Waiting to send');
    expect(outboxStatusLook({ status: 'queued', attempts: 1 }).word).toBe('Waiting to retry');
  });

  it('offers Retry only for messages not yet sent, and retries the chosen one', async () => {
    const retries = await loader.getAllHarnesses(MatButtonHarness.with({ text: /Retry$/ }));
    expect(retries).toHaveLength(2);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Retry the message to wren@example.org"]' }))).click();

    const request = http.expectOne('/api/outbox/3/retry');
    expect(request.request.method).toBe('POST');
    request.flush({ ...MESSAGES[0], status: 'queued' });
    http.expectOne('/api/outbox').flush([entry({ ...MESSAGES[0], status: 'sent', sentAt: '2026-03-02T11:00:00.000Z', lastError: null }), MESSAGES[1], MESSAGES[2]]);
    await fixture.whenStable();

    expect((await column('status'))[0]).toBe('mark_email_readSent');
    expect(element().querySelector('[role="status"]')?.textContent).toContain('The message to wren@example.org was sent.');
  });

  it('opens a message to show its body', async () => {
    expect(element().querySelector('tm-message-detail')).toBeNull();
    const subject = [...element().querySelectorAll<HTMLButtonElement>('button.subject')].find((button) =>
      button.textContent?.includes('governance pack ready'),
    );
    subject?.click();
    await fixture.whenStable();
    expect(subject?.getAttribute('aria-pressed')).toBe('true');
    const detail = element().querySelector('tm-message-detail');
    expect(detail?.querySelector('pre')?.textContent).toBe('Dear Kit,\n\nSign in to download it: http://localhost/reports');
    expect(detail?.textContent).toContain('committee@example.org');
    // A sent message cannot be sent again.
    expect(detail?.textContent).not.toContain('Retry now');
  });

  it('runs the schedules and shows their counts', async () => {
    await (await loader.getHarness(MatButtonHarness.with({ text: /Run the mail schedules now/ }))).click();
    const request = http.expectOne('/api/outbox/run');
    expect(request.request.method).toBe('POST');
    request.flush({ digests: 2, reminders: 0, sent: 2, failed: 0, retrying: 1 });
    http.expectOne('/api/outbox').flush(MESSAGES);
    await fixture.whenStable();
    expect(element().querySelector('[role="status"]')?.textContent).toContain(
      'Queued 2 recall round-ups and 0 action nudges. Delivered 2, 1 waiting to retry, 0 failed.',
    );
  });
});
