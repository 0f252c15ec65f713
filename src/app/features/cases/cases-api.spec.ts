import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { PhotoView } from '@tidemark/shared';
import { firstValueFrom, toArray } from 'rxjs';
import { SHOWS_OWN_ERRORS } from '../../core/http/shows-own-errors';
import { CasesApi, photoThumbnailUrl, photoUrl } from './cases-api';
import { caseDetailFixture } from './testing/case-detail-fixture';

const PHOTO: PhotoView = {
  id: 77,
  visitId: null,
  kind: 'recall',
  contentType: 'image/jpeg',
  bytes: 2048,
  sha256: 'ab'.repeat(32),
  width: 640,
  height: 480,
  monthTaken: '2026-02',
  uploadedBy: { id: 5, displayName: 'Wren Adeyemi' },
  createdAt: '2026-02-16T10:00:00.000Z',
};

describe('CasesApi', () => {
  let api: CasesApi;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    api = TestBed.inject(CasesApi);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('sends paging, sorting and only the filters in use', async () => {
    const result = firstValueFrom(
      api.list({ page: 2, pageSize: 50, sort: 'patientCode', direction: 'asc', procedure: 'gingivectomy', tooth: 21, from: '2026-01-01', patientCode: '' }),
    );
    const request = http.expectOne((candidate) => candidate.url === '/api/cases');
    expect(request.request.method).toBe('GET');
    const params = request.request.params;
    expect(Object.fromEntries(params.keys().map((key) => [key, params.get(key)]))).toEqual({
      page: '2',
      pageSize: '50',
      sort: 'patientCode',
      direction: 'asc',
      procedure: 'gingivectomy',
      tooth: '21',
      from: '2026-01-01',
    });
    request.flush({ items: [], total: 0 });
    expect(await result).toEqual({ items: [], total: 0 });
  });

  it('loads one case and shows its own errors', async () => {
    const detail = caseDetailFixture();
    const result = firstValueFrom(api.get(12));
    const request = http.expectOne('/api/cases/12');
    expect(request.request.context.get(SHOWS_OWN_ERRORS)).toBe(true);
    request.flush(detail);
    expect((await result).patient.code).toBe('TST-0012');
  });

  it('moves a status with PATCH, carrying version and reason', () => {
    void firstValueFrom(api.update(12, { version: 4, reason: 'Follow-up complete', status: 'concluded' }));
    const request = http.expectOne('/api/cases/12');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ version: 4, reason: 'Follow-up complete', status: 'concluded' });
    request.flush(caseDetailFixture({ status: 'concluded', version: 5 }));
  });

  it('adds and corrects complications at their own addresses', () => {
    const added = { type: 'pain' as const, grade: 'I' as const, onsetDate: '2026-01-07' };
    void firstValueFrom(api.addComplication(12, added));
    const post = http.expectOne('/api/cases/12/complications');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual(added);
    post.flush({});

    void firstValueFrom(api.updateComplication(9, { version: 2, reason: 'Resolved at review', resolutionDate: '2026-01-20' }));
    const patch = http.expectOne('/api/complications/9');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ version: 2, reason: 'Resolved at review', resolutionDate: '2026-01-20' });
    patch.flush({});
  });

  it('uploads a photograph as multipart form data and reports progress events', async () => {
    const file = new Blob(['jpeg bytes'], { type: 'image/jpeg' });
    const events = firstValueFrom(api.uploadPhoto(12, { file, fileName: 'upper.jpg', kind: 'recall', visitId: 301, monthTaken: '2026-02' }).pipe(toArray()));
    const request = http.expectOne('/api/cases/12/photos');
    expect(request.request.method).toBe('POST');
    expect(request.request.reportProgress).toBe(true);
    const body = request.request.body;
    expect(body).toBeInstanceOf(FormData);
    if (!(body instanceof FormData)) return;
    expect(body.get('kind')).toBe('recall');
    expect(body.get('visitId')).toBe('301');
    expect(body.get('monthTaken')).toBe('2026-02');
    expect(body.get('file')).toBeInstanceOf(Blob);
    request.event({ type: HttpEventType.UploadProgress, loaded: 5, total: 10 });
    request.flush(PHOTO, { status: 201, statusText: 'Created' });
    const types = (await events).map((event) => event.type);
    expect(types).toContain(HttpEventType.UploadProgress);
    expect(types).toContain(HttpEventType.Response);
  });

  it('leaves optional photo fields out when not given', () => {
    // Subscribed to the end: firstValueFrom would cancel the upload at its first (sent) event.
    api.uploadPhoto(12, { file: new Blob(['x']), fileName: 'x.png', kind: 'radiograph' }).subscribe();
    const request = http.expectOne('/api/cases/12/photos');
    const body = request.request.body;
    if (!(body instanceof FormData)) throw new Error('Expected form data.');
    expect(body.has('visitId')).toBe(false);
    expect(body.has('monthTaken')).toBe(false);
    request.flush(PHOTO);
  });

  it('lists operators for the filter', () => {
    void firstValueFrom(api.operators());
    http.expectOne('/api/operators').flush([]);
  });

  it('builds same-origin photo addresses', () => {
    expect(photoThumbnailUrl(77)).toBe('/api/photos/77/thumbnail');
    expect(photoUrl(77)).toBe('/api/photos/77');
  });
});
