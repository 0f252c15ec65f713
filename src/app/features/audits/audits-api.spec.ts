import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Observable } from 'rxjs';
import { firstValueFrom } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { AuditsApi } from './audits-api';
import { auditFixture } from './testing/audit-fixture';

describe('AuditsApi', () => {
  let api: AuditsApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(AuditsApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  /** Subscribes, then returns the one request the call made. */
  function sent(call: Observable<unknown>, url: string) {
    void firstValueFrom(call);
    return http.expectOne((request) => request.url === url);
  }

  it('reads audits, schedules and operators, leaving read failures to the global notice', () => {
    for (const [call, url] of [
      [api.list(), '/api/audits'],
      [api.schedules(), '/api/schedules'],
      [api.operators(), '/api/operators'],
      [api.notes(12), '/api/audits/12/notes'],
    ] as const) {
      const request = sent(call, url);
      expect(request.request.method).toBe('GET');
      expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(false);
      request.flush([]);
    }
  });

  it('loads one audit and explains a missing one itself', () => {
    const request = sent(api.get(12), '/api/audits/12');
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush(auditFixture());
  });

  it('creates, updates with version, and removes an audit', () => {
    const body = { title: 'Upper front margins', scheduleId: 3, cohort: { indications: ['aesthetic' as const] } };
    const post = sent(api.create(body), '/api/audits');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual(body);
    post.flush(auditFixture());

    const patch = sent(api.update(12, { title: 'Renamed', version: 4 }), '/api/audits/12');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ title: 'Renamed', version: 4 });
    patch.flush(auditFixture());

    const remove = sent(api.remove(12), '/api/audits/12');
    expect(remove.request.method).toBe('DELETE');
    remove.flush(null);
  });

  it('asks for the live cohort count with the definition wrapped as { cohort }', () => {
    const request = sent(api.previewCohort({ regions: ['maxillary-anterior'] }), '/api/audits/cohort-preview');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ cohort: { regions: ['maxillary-anterior'] } });
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush({ cases: 1, patients: 1, sites: 2 });
  });

  it('adds standards to an audit and edits or removes them at their own address', () => {
    const standard = { criterion: 'Mean rebound stays low', metric: 'mean-rebound' as const, intervalKey: '6m', comparator: '<=' as const, target: 1 };
    const post = sent(api.addStandard(12, standard), '/api/audits/12/standards');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual(standard);
    post.flush({});

    const patch = sent(api.updateStandard(31, { ...standard, version: 2 }), '/api/standards/31');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ ...standard, version: 2 });
    patch.flush({});

    const remove = sent(api.removeStandard(31), '/api/standards/31');
    expect(remove.request.method).toBe('DELETE');
    remove.flush(null);
  });

  it('opens, moves and removes cycles', () => {
    const post = sent(api.addCycle(12, { periodStart: '2026-01-01', periodEnd: '2026-06-30', notes: 'Re-audit' }), '/api/audits/12/cycles');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual({ periodStart: '2026-01-01', periodEnd: '2026-06-30', notes: 'Re-audit' });
    post.flush({});

    const patch = sent(api.updateCycle(71, { state: 'reported', version: 3 }), '/api/cycles/71');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ state: 'reported', version: 3 });
    patch.flush({});

    const remove = sent(api.removeCycle(71), '/api/cycles/71');
    expect(remove.request.method).toBe('DELETE');
    remove.flush(null);
  });

  it('keeps action plans under their cycle, edited at /api/actions/:id', () => {
    const action = { action: 'Calibrate examiners', ownerId: 5, dueDate: '2026-05-01', state: 'open' as const };
    const post = sent(api.addAction(71, action), '/api/cycles/71/actions');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual(action);
    post.flush({});

    const patch = sent(api.updateAction(8, { state: 'done', version: 1 }), '/api/actions/8');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ state: 'done', version: 1 });
    patch.flush({});

    const remove = sent(api.removeAction(8), '/api/actions/8');
    expect(remove.request.method).toBe('DELETE');
    remove.flush(null);
  });

  it('posts review notes for the audit', () => {
    const note = { topic: 'standard:31', text: 'Check the 3-month readings.', cycleId: 71 };
    const request = sent(api.addNote(12, note), '/api/audits/12/notes');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual(note);
    request.flush({});
  });

  it('asks for live results without a cycle, and a cycle’s results with cycleId', () => {
    const live = sent(api.results(12), '/api/audits/12/results');
    expect(live.request.params.keys()).toEqual([]);
    live.flush({});
    const cycle = sent(api.results(12, 71), '/api/audits/12/results');
    expect(cycle.request.params.get('cycleId')).toBe('71');
    cycle.flush({});
  });

  it('compares two cycles with first and second in the query', () => {
    const request = sent(api.compare(12, 71, 72), '/api/audits/12/compare');
    expect(request.request.method).toBe('GET');
    expect(request.request.params.get('first')).toBe('71');
    expect(request.request.params.get('second')).toBe('72');
    request.flush({});
  });
});
