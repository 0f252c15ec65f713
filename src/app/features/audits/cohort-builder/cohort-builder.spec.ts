import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { textOf } from '../../cases/testing/text-of';
import { createAuditForm } from '../scope/audit-form';
import { OPERATORS } from '../testing/audit-fixture';
import { COUNT_PAUSE_MS, CohortBuilder } from './cohort-builder';

const EVERY_LIST_EMPTY = {
  surgeryFrom: null,
  surgeryTo: null,
  procedures: [],
  operatorIds: [],
  phenotypes: [],
  indications: [],
  smoking: [],
  diabetes: [],
  regions: [],
  teeth: [],
};

describe('CohortBuilder', () => {
  let fixture: ComponentFixture<CohortBuilder>;
  let http: HttpTestingController;
  let cohort: ReturnType<typeof createAuditForm>['controls']['cohort'];

  beforeEach(() => {
    vi.useFakeTimers();
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    cohort = createAuditForm().controls.cohort;
    fixture = TestBed.createComponent(CohortBuilder);
    fixture.componentRef.setInput('cohort', cohort);
    fixture.componentRef.setInput('operators', OPERATORS);
    fixture.detectChanges();
  });

  afterEach(() => {
    http.verify();
    vi.useRealTimers();
  });

  const element = (): HTMLElement => fixture.nativeElement;
  const countText = (): string => textOf(element().querySelector('[role="status"]'));
  const previews = () => http.match('/api/audits/cohort-preview');

  /** Presses a chip the way a finger does: on its primary action. */
  function pressChip(label: string): void {
    const chips = [...element().querySelectorAll<HTMLElement>('mat-chip-option')];
    const chip = chips.find((candidate) => textOf(candidate).includes(label));
    if (!chip) throw new Error(`No chip "${label}".`);
    chip.querySelector<HTMLElement>('.mdc-evolution-chip__action--primary')?.click();
    fixture.detectChanges();
  }

  it('counts the starting cohort once the pause has passed, and shows cases · patients · sites', () => {
    vi.advanceTimersByTime(COUNT_PAUSE_MS - 1);
    expect(previews()).toHaveLength(0);
    vi.advanceTimersByTime(1);
    const [request] = previews();
    expect(request?.request.method).toBe('POST');
    expect(request?.request.body).toEqual({ cohort: EVERY_LIST_EMPTY });
    request?.flush({ cases: 14, patients: 11, sites: 1 });
    fixture.detectChanges();
    expect(countText()).toContain('14 cases · 11 patients · 1 site');
  });

  it('waits until the chips settle, then asks once for the latest definition', () => {
    vi.advanceTimersByTime(COUNT_PAUSE_MS);
    previews()[0]?.flush({ cases: 40, patients: 30, sites: 90 });

    pressChip('Upper front');
    vi.advanceTimersByTime(COUNT_PAUSE_MS - 100);
    pressChip('Excess gingival display');
    vi.advanceTimersByTime(COUNT_PAUSE_MS - 1);
    expect(previews()).toHaveLength(0);
    vi.advanceTimersByTime(1);

    const [request, ...others] = previews();
    expect(others).toHaveLength(0);
    expect(request?.request.body).toEqual({ cohort: { ...EVERY_LIST_EMPTY, regions: ['maxillary-anterior'], indications: ['aesthetic'] } });
    fixture.detectChanges();
    // The last count stays on show while the new one is on its way.
    expect(countText()).toContain('40 cases');
    expect(countText()).toContain('updating');
    request?.flush({ cases: 9, patients: 8, sites: 21 });
    fixture.detectChanges();
    expect(countText()).toContain('9 cases · 8 patients · 21 sites');
  });

  it('asks nothing while the surgery range runs backwards, and says why', () => {
    vi.advanceTimersByTime(COUNT_PAUSE_MS);
    previews()[0]?.flush({ cases: 40, patients: 30, sites: 90 });
    cohort.controls.surgeryFrom.setValue('2026-03-01');
    cohort.controls.surgeryTo.setValue('2026-01-01');
    vi.advanceTimersByTime(COUNT_PAUSE_MS);
    expect(previews()).toHaveLength(0);
    fixture.detectChanges();
    expect(countText()).toContain('Finish the surgery dates');
  });

  it('adds and removes single teeth from the tooth chart', () => {
    const toggle = [...element().querySelectorAll<HTMLButtonElement>('button')].find((button) => textOf(button).includes('Choose single teeth'));
    toggle?.click();
    fixture.detectChanges();
    element().querySelector<HTMLElement>('[data-tooth="21"]')?.click();
    element().querySelector<HTMLElement>('[data-tooth="11"]')?.click();
    fixture.detectChanges();
    expect(cohort.controls.teeth.value).toEqual([21, 11]);
    element().querySelector<HTMLElement>('[data-tooth="21"]')?.click();
    expect(cohort.controls.teeth.value).toEqual([11]);
    vi.advanceTimersByTime(COUNT_PAUSE_MS);
    expect(previews()[0]?.request.body).toEqual({ cohort: { ...EVERY_LIST_EMPTY, teeth: [11] } });
    previews().forEach((request) => request.flush({ cases: 1, patients: 1, sites: 1 }));
  });
});
