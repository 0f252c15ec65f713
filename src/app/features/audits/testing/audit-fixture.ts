import type { AuditResults, AuditView, CycleView, OperatorView, ScheduleView, StandardView } from '@tidemark/shared';

/** An invented schedule for specs: three intervals. */
export const SCHEDULE: ScheduleView = {
  id: 3,
  name: 'Spec schedule',
  isDefault: true,
  version: 1,
  intervals: [
    { key: '6w', label: '6 weeks', targetDays: 42, windowBeforeDays: 7, windowAfterDays: 14 },
    { key: '3m', label: '3 months', targetDays: 91, windowBeforeDays: 14, windowAfterDays: 21 },
    { key: '6m', label: '6 months', targetDays: 182, windowBeforeDays: 14, windowAfterDays: 28 },
  ],
};

/** Operators as `/api/operators` lists them. */
export const OPERATORS: OperatorView[] = [
  { id: 5, displayName: 'Wren Adeyemi' },
  { id: 6, displayName: 'Jonah Pike' },
];

/** A standard for specs; overrides set what a spec looks at. */
export function standardFixture(overrides: Partial<StandardView> = {}): StandardView {
  return {
    id: 31,
    auditId: 12,
    position: 1,
    criterion: 'Mean rebound at 3 months stays at 0.9 mm or less',
    metric: 'mean-rebound',
    intervalKey: '3m',
    thresholdMm: null,
    thresholdPct: null,
    minGrade: null,
    comparator: '<=',
    target: 0.9,
    evidenceSource: 'Spec source, 2020',
    exceptions: 'Re-treated sites',
    version: 2,
    ...overrides,
  };
}

/** A cycle for specs. */
export function cycleFixture(overrides: Partial<CycleView> = {}): CycleView {
  return {
    id: 71,
    auditId: 12,
    number: 1,
    periodStart: '2025-01-01',
    periodEnd: '2025-06-30',
    state: 'weighing',
    frozenAt: null,
    presentedDate: null,
    notes: '',
    version: 3,
    actions: [],
    ...overrides,
  };
}

/** An invented audit with one standard and one cycle. */
export function auditFixture(overrides: Partial<AuditView> = {}): AuditView {
  return {
    id: 12,
    title: 'Spec audit of upper front margins',
    rationale: 'Spec rationale.',
    lead: { id: 2, displayName: 'Aiko Sato' },
    schedule: SCHEDULE,
    thresholds: { stable: 0.5, relapse: 1 },
    cohort: {
      surgeryFrom: null,
      surgeryTo: null,
      procedures: [],
      operatorIds: [5],
      phenotypes: [],
      indications: ['aesthetic'],
      smoking: [],
      diabetes: [],
      regions: ['maxillary-anterior'],
      teeth: [],
    },
    reauditDate: '2026-09-01',
    version: 4,
    standards: [standardFixture()],
    cycles: [cycleFixture()],
    ...overrides,
  };
}

/** Live results with one met standard. */
export function resultsFixture(standards: StandardView[] = [standardFixture()]): AuditResults {
  const none = { count: 0, n: 0, p: null, lower: null, upper: null };
  const summary: AuditResults['summary'] = {
    asOf: '2026-03-01',
    nRecords: 0,
    nUnscheduledRecords: 0,
    nSites: 30,
    nPatients: 11,
    intervals: [],
    complications: { nCases: 14, casesWithComplication: none, byGrade: [], byType: [] },
    recall: { asOf: '2026-03-01', nCases: 14, nWithdrawn: 0, intervals: [], lossToFollowUp: none },
  };
  return {
    auditId: 12,
    cycleId: null,
    frozenAt: null,
    asOf: '2026-03-01',
    cohort: { cases: 14, patients: 11, sites: 30 },
    thresholds: { stable: 0.5, relapse: 1 },
    schedule: SCHEDULE.intervals,
    summary,
    groupBy: null,
    groups: [],
    standards: standards.map((standard) => ({
      standard,
      unit: 'mm' as const,
      observed: { value: 0.62, ci95: [0.41, 0.83] as const, n: 11, count: null },
      verdict: 'met' as const,
    })),
    reboundHistograms: [],
  };
}
