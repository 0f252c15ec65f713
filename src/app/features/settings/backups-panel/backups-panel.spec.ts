import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpErrorResponse, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { LOCALE_ID } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { MatSnackBarHarness } from '@angular/material/snack-bar/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import type { BackupTaken, BackupsOverview, PhotoStorageOverview } from '@tidemark/shared';
import { SYSTEM_OVERVIEW } from '../testing/system-overview-fixture';
import { BackupsPanel, backupFailure } from './backups-panel';

const TAKEN: BackupTaken = { name: 'tidemark-20260302T101500Z.sqlite', bytes: 48_400_000, takenAt: '2026-03-02T10:15:00.000Z', durationMs: 310 };

describe('BackupsPanel', () => {
  let fixture: ComponentFixture<BackupsPanel>;
  let loader: HarnessLoader;
  let documentLoader: HarnessLoader;
  let http: HttpTestingController;
  let taken: BackupTaken[];

  async function render(backups: BackupsOverview, photoStorage: PhotoStorageOverview = null): Promise<void> {
    fixture = TestBed.createComponent(BackupsPanel);
    fixture.componentRef.setInput('backups', backups);
    fixture.componentRef.setInput('photoStorage', photoStorage);
    taken = [];
    fixture.componentInstance.backupTaken.subscribe((backup) => taken.push(backup));
    loader = TestbedHarnessEnvironment.loader(fixture);
    documentLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), { provide: LOCALE_ID, useValue: 'en-GB' }] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  const takeButton = () => loader.getHarness(MatButtonHarness.with({ text: /Take a backup now|Taking a backup/ }));

  it('lists the backups newest first with who took them and their size', async () => {
    await render(SYSTEM_OVERVIEW.backups);
    const table = await loader.getHarness(MatTableHarness);
    const columns = await table.getCellTextByColumnName();
    expect(columns['name']?.text).toEqual(['tidemark-20260302T020000Z.sqlite', 'tidemark-20260301T163000Z.sqlite']);
    expect(columns['kind']?.text).toEqual(['Daily round', 'On request']);
    // 48,100,000 bytes in decimal megabytes (IEC 80000-13), one decimal.
    expect(columns['size']?.text).toEqual(['48.1 MB', '47.9 MB']);
    expect(fixture.nativeElement.textContent).toContain('keeps the newest 7');
  });

  it('takes a backup with a progress indicator, then confirms it and tells the page', async () => {
    await render(SYSTEM_OVERVIEW.backups);
    await (await takeButton()).click();
    expect(await (await takeButton()).isDisabled()).toBe(true);
    expect(await (await takeButton()).getText()).toContain('Taking a backup…');
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(1);

    const request = http.expectOne('/api/settings/backups');
    expect(request.request.method).toBe('POST');
    request.flush(TAKEN, { status: 201, statusText: 'Created' });
    await fixture.whenStable();

    expect(taken).toEqual([TAKEN]);
    expect(await loader.getAllHarnesses(MatProgressBarHarness)).toHaveLength(0);
    expect(await (await takeButton()).isDisabled()).toBe(false);
    const snackBar = await documentLoader.getHarness(MatSnackBarHarness);
    expect(await snackBar.getMessage()).toBe('Backup tidemark-20260302T101500Z.sqlite taken and checked (48.4 MB).');
  });

  it("shows the server's reason when a backup is refused, and lets the person try again", async () => {
    await render(SYSTEM_OVERVIEW.backups);
    await (await takeButton()).click();
    http
      .expectOne('/api/settings/backups')
      .flush({ error: { code: 'conflict', message: 'A backup is being taken already. Wait for it to finish, then look at the list.' } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]').textContent).toContain('A backup is being taken already.');
    expect(taken).toEqual([]);
    expect(await (await takeButton()).isDisabled()).toBe(false);
  });

  it('says the photographs of the uploads folder are in each backup, and those in object storage are not', async () => {
    await render(SYSTEM_OVERVIEW.backups, { kind: 'data-folder' });
    const text = (): string => fixture.nativeElement.querySelector('.note').textContent;
    expect(text()).toContain('The photographs it refers to are kept beside it, in a folder of the same name ending in “-photos”');
    expect(text()).not.toContain('not in it');
    fixture.componentRef.setInput('photoStorage', { kind: 'object-storage', bucket: 'harbour-photos', prefix: '', region: 'eu-west-1', endpoint: null });
    await fixture.whenStable();
    expect(text()).toContain('Photographs are not in it: they are kept in object storage, whose own versioning keeps their history.');
  });

  it('offers no backup button on PostgreSQL and says which tools back it up', async () => {
    await render({ isAvailable: false, dailyKept: 0, files: [] });
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Take a backup now/ }))).toHaveLength(0);
    const text: string = fixture.nativeElement.textContent;
    expect(text).toContain('pg_dump');
    expect(text).toContain('No backups in the backups folder yet.');
  });

  it('puts a server failure in words that say the live database is safe', () => {
    expect(backupFailure(new HttpErrorResponse({ status: 500, error: { error: { code: 'internal', message: 'x' } } }))).toContain('The live database is unchanged.');
    expect(backupFailure(new Error('offline'))).toBe('The backup could not be taken. Try again.');
  });
});
