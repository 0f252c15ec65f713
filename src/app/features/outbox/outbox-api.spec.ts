import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { OutboxApi } from './outbox-api';
import { describeScheduleRun } from './outbox-entry';

describe('OutboxApi', () => {
  let api: OutboxApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(OutboxApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists messages with GET /api/outbox', async () => {
    const result = firstValueFrom(api.list());
    const request = http.expectOne('/api/outbox');
    expect(request.request.method).toBe('GET');
    request.flush([]);
    expect(await result).toEqual([]);
  });

  it('retries one message with POST /api/outbox/:id/retry', async () => {
    const result = firstValueFrom(api.retry(9));
    const request = http.expectOne('/api/outbox/9/retry');
    expect(request.request.method).toBe('POST');
    request.flush({ id: 9 });
    expect(await result).toMatchObject({ id: 9 });
  });

  it('runs the schedules with POST /api/outbox/run', async () => {
    const counts = { digests: 2, reminders: 1, sent: 3, failed: 0, retrying: 0 };
    const result = firstValueFrom(api.runSchedules());
    const request = http.expectOne('/api/outbox/run');
    expect(request.request.method).toBe('POST');
    request.flush(counts);
    expect(await result).toEqual(counts);
  });

  it('says what a schedule run did, singular and plural', () => {
    expect(describeScheduleRun({ digests: 2, reminders: 1, sent: 3, failed: 1, retrying: 0 })).toBe(
      'Queued 2 recall round-ups and 1 action nudge. Delivered 3, 0 waiting to retry, 1 failed.',
    );
  });
});
