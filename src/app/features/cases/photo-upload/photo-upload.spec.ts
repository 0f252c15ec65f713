import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { PhotoView } from '@tidemark/shared';
import { ACCEPTED_PHOTO_TYPES, PhotoUpload } from './photo-upload';

const STORED: PhotoView = {
  id: 90,
  visitId: null,
  kind: 'pre-operative',
  contentType: 'image/jpeg',
  bytes: 1200,
  sha256: 'cd'.repeat(32),
  width: 800,
  height: 600,
  monthTaken: '2026-01',
  uploadedBy: { id: 5, displayName: 'Wren Adeyemi' },
  createdAt: '2026-01-05T09:00:00.000Z',
};

describe('PhotoUpload', () => {
  let fixture: ComponentFixture<PhotoUpload>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let uploaded: PhotoView[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(PhotoUpload);
    fixture.componentRef.setInput('caseId', 12);
    uploaded = [];
    fixture.componentInstance.uploaded.subscribe((photo) => uploaded.push(photo));
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  const element = (): HTMLElement => fixture.nativeElement;

  /** Simulates picking a file (jsdom cannot fill a file input's FileList itself). */
  async function pick(file: File): Promise<void> {
    const input = element().querySelector<HTMLInputElement>('input[type="file"]');
    if (!input) throw new Error('No file input.');
    Object.defineProperty(input, 'files', { configurable: true, value: { length: 1, 0: file, item: () => file } });
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
  }

  const uploadButton = () => loader.getHarness(MatButtonHarness.with({ text: /Upload/ }));

  it('offers only the image types the server accepts', () => {
    expect(element().querySelector('input[type="file"]')?.getAttribute('accept')).toBe('image/jpeg,image/png,image/webp');
    expect(ACCEPTED_PHOTO_TYPES).toBe('image/jpeg,image/png,image/webp');
  });

  it('shows a determinate bar that follows the upload, then hands over the stored photo', async () => {
    expect(await (await uploadButton()).isDisabled()).toBe(true);
    const kind = await loader.getHarness(MatSelectHarness);
    await kind.open();
    await kind.clickOptions({ text: 'Before surgery' });
    await pick(new File(['jpeg bytes'], 'upper-front.jpg', { type: 'image/jpeg' }));
    await (await uploadButton()).click();

    const request = http.expectOne('/api/cases/12/photos');
    const body = request.request.body;
    expect(body instanceof FormData && body.get('kind')).toBe('pre-operative');

    request.event({ type: HttpEventType.UploadProgress, loaded: 30, total: 100 });
    await fixture.whenStable();
    const bar = await loader.getHarness(MatProgressBarHarness);
    expect(await bar.getMode()).toBe('determinate');
    expect(await bar.getValue()).toBe(30);
    expect(element().textContent).toContain('30 % sent');

    request.event({ type: HttpEventType.UploadProgress, loaded: 100, total: 100 });
    await fixture.whenStable();
    expect(await bar.getValue()).toBe(100);
    expect(element().textContent).toContain('Checking and storing the photograph');

    request.flush(STORED, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(uploaded).toEqual([STORED]);
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
    expect(element().querySelector('[role="status"]')?.textContent).toContain('upper-front.jpg was uploaded as “Before surgery”.');
  });

  it.each([
    [413, 'payload_too_large', 'The photograph is larger than 15 MB.'],
    [415, 'unsupported_media_type', 'Only JPEG, PNG and WebP photographs are accepted (checked by content, not by name).'],
  ])("shows the server's own reason for a %i", async (status, code, message) => {
    await pick(new File(['not really an image'], 'scan.jpg', { type: 'image/jpeg' }));
    await (await uploadButton()).click();
    http.expectOne('/api/cases/12/photos').flush({ error: { code, message } }, { status, statusText: 'Refused' });
    await fixture.whenStable();
    expect(element().querySelector('[role="alert"]')?.textContent?.trim()).toBe(`error${message}`);
    expect(uploaded).toEqual([]);
  });

  it('asks for the month taken as labelled, hinted YYYY-MM text and sends it', async () => {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Month taken' }));
    const month = await loader.getHarness(MatInputHarness.with({ placeholder: 'YYYY-MM' }));
    expect(await month.getType()).toBe('text');
    const input = element().querySelector<HTMLInputElement>('input[placeholder="YYYY-MM"]');
    const label = input ? element().querySelector(`label[for="${input.id}"]`) : null;
    expect(label?.textContent?.trim()).toBe('Month taken');
    const hint = element().querySelector(`#${input?.getAttribute('aria-describedby')?.split(' ')[0]}`);
    expect(hint?.textContent?.trim()).toBe('Month and year the photograph was taken, e.g. 2026-03. Empty means this month.');

    // Typed from the keyboard; the shared isoMonth rule (shared/schemas/clinical-fields.ts) refuses a one-digit month.
    await month.setValue('2026-3');
    await month.blur();
    expect(await field.getTextErrors()).toEqual(['Use the form YYYY-MM.']);
    await month.setValue('2026-03');
    expect(await field.getTextErrors()).toEqual([]);

    await pick(new File(['jpeg bytes'], 'lower-left.jpg', { type: 'image/jpeg' }));
    await (await uploadButton()).click();
    const request = http.expectOne('/api/cases/12/photos');
    const body = request.request.body;
    expect(body instanceof FormData && body.get('monthTaken')).toBe('2026-03');
    request.flush(STORED, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
  });

  it('refuses a file over 15 MB before sending it', async () => {
    const big = new File(['x'], 'huge.png', { type: 'image/png' });
    Object.defineProperty(big, 'size', { value: 16 * 1024 * 1024 });
    await pick(big);
    expect(element().querySelector('[role="alert"]')?.textContent).toContain('That file is 16.0 MB; photographs up to 15 MB are accepted.');
    expect(await (await uploadButton()).isDisabled()).toBe(true);
    http.expectNone('/api/cases/12/photos');
  });
});
