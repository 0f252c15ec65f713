import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { LOCALE_ID } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import type { SystemOverview } from '@tidemark/shared';
import { SYSTEM_OVERVIEW } from '../testing/system-overview-fixture';
import { SettingsPage } from './settings-page';

describe('SettingsPage', () => {
  let fixture: ComponentFixture<SettingsPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function render(overview: SystemOverview | 'fails'): Promise<void> {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting(), { provide: LOCALE_ID, useValue: 'en-GB' }] });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SettingsPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    const request = http.expectOne('/api/settings/system');
    if (overview === 'fails') request.flush({ error: { code: 'internal', message: 'x' } }, { status: 500, statusText: 'Server Error' });
    else request.flush(overview);
    await fixture.whenStable();
  }

  afterEach(() => http.verify());

  const text = (): string => fixture.nativeElement.textContent.replace(/\s+/g, ' ');
  const headings = (): string[] => Array.from(fixture.nativeElement.querySelectorAll('h1, h2'), (heading: Element) => `${heading.tagName} ${heading.textContent?.replace(/\s+/g, ' ').trim()}`);

  it('has one page heading and a labelled section per card', async () => {
    await render(SYSTEM_OVERVIEW);
    expect(headings()).toEqual(['H1 Settings', 'H2 database Database', 'H2 photo_library Photographs', 'H2 mail Mail', 'H2 shield_lock Sign-in', 'H2 backup Backups']);
    for (const section of Array.from<HTMLElement>(fixture.nativeElement.querySelectorAll('section[aria-labelledby]'))) {
      expect(fixture.nativeElement.querySelector(`#${section.getAttribute('aria-labelledby')}`)).not.toBeNull();
    }
  });

  it('describes a SQLite installation: file, sizes, journal, schema and version', async () => {
    await render(SYSTEM_OVERVIEW);
    const page = text();
    expect(page).toContain('One SQLite file on this server');
    expect(page).toContain('tidemark.sqlite');
    expect(page).toContain('48.3 MB');
    expect(page).toContain('plus 1.2 MB of recent saves in the write-ahead log');
    expect(page).toContain('Write-ahead log (WAL)');
    expect(page).toContain('Up to date (5 of 5 schema steps applied).');
    expect(page).toContain('Latest step: SecondFactor1765200000000');
    expect(page).toContain('0.1.0');
  });

  it('describes mail, photographs and the sign-in rules in words', async () => {
    await render(SYSTEM_OVERVIEW);
    const page = text();
    expect(page).toContain('Through smtp.example.org, port 587, upgraded to TLS when the server offers it, with a mail account.');
    expect(page).toContain('Tidemark <no-reply@example.org>');
    expect(page).toContain('In the uploads folder of the data folder');
    // The backups card is told where photographs are kept: backups hold those of the uploads folder.
    expect(page).toContain('in a folder of the same name ending in “-photos”');
    expect(page).toContain('Required of administrators and audit leads');
    expect(page).toContain('Signed out after 30 minutes without activity, and 8 hours after signing in');
    expect(page).not.toContain('Demo mode is on');
  });

  it('describes a PostgreSQL installation and flags a schema that is behind', async () => {
    await render({
      ...SYSTEM_OVERVIEW,
      isDemo: true,
      database: { kind: 'postgres', host: 'db.example.org:5432', database: 'tidemark', serverVersion: '15.8' },
      schema: { latestMigration: 'Mail1764900000000', appliedCount: 4, knownCount: 5, isUpToDate: false },
      backups: { isAvailable: false, dailyKept: 0, files: [] },
    });
    const page = text();
    expect(page).toContain('PostgreSQL server');
    expect(page).toContain('db.example.org:5432');
    expect(page).toContain('15.8');
    expect(page).toContain('Behind this version of Tidemark (4 of 5 schema steps applied).');
    expect(page).toContain('Demo mode is on');
    expect(page).not.toContain('SQLite file');
  });

  it('reads the overview again after a backup, so the list and sizes are current', async () => {
    await render(SYSTEM_OVERVIEW);
    await (await loader.getHarness(MatButtonHarness.with({ text: /Take a backup now/ }))).click();
    http.expectOne('/api/settings/backups').flush({ name: 'tidemark-20260302T101500Z.sqlite', bytes: 48_400_000, takenAt: '2026-03-02T10:15:00.000Z', durationMs: 200 }, { status: 201, statusText: 'Created' });
    const again = http.expectOne('/api/settings/system');
    const newest = { name: 'tidemark-20260302T101500Z.sqlite', kind: 'manual' as const, bytes: 48_400_000, takenAt: '2026-03-02T10:15:00.000Z' };
    again.flush({ ...SYSTEM_OVERVIEW, backups: { ...SYSTEM_OVERVIEW.backups, files: [newest, ...SYSTEM_OVERVIEW.backups.files] } });
    await fixture.whenStable();
    expect(text()).toContain('tidemark-20260302T101500Z.sqlite');
  });

  it('offers a retry when the overview cannot be loaded', async () => {
    await render('fails');
    expect(text()).toContain('The settings could not be loaded.');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Try again' }))).click();
    http.expectOne('/api/settings/system').flush(SYSTEM_OVERVIEW);
    await fixture.whenStable();
    expect(text()).toContain('One SQLite file on this server');
    expect(text()).not.toContain('could not be loaded');
  });
});
