import type { AuditView, CycleView } from '@tidemark/shared';

/** An invented cycle for specs. */
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

/** An invented audit for specs: a reported (frozen) first cycle and a second one gathering data. */
export function auditFixture(overrides: Partial<AuditView> = {}): AuditView {
  return {
    id: 12,
    title: 'Spec audit of upper front margins',
    rationale: 'Spec rationale.',
    lead: { id: 2, displayName: 'Aiko Sato' },
    schedule: { id: 3, name: 'Spec schedule', isDefault: true, version: 1, intervals: [] },
    thresholds: { stable: 0.5, relapse: 1 },
    cohort: {
      surgeryFrom: null,
      surgeryTo: null,
      procedures: [],
      operatorIds: [],
      phenotypes: [],
      indications: ['aesthetic'],
      smoking: [],
      diabetes: [],
      regions: [],
      teeth: [],
    },
    reauditDate: null,
    version: 4,
    standards: [],
    cycles: [
      cycleFixture({ id: 71, number: 1, state: 'reported', frozenAt: '2025-08-01T10:00:00.000Z', periodStart: '2025-01-01', periodEnd: '2025-06-30' }),
      cycleFixture({ id: 72, number: 2, state: 'gathering', periodStart: '2025-07-01', periodEnd: '2025-12-31' }),
    ],
    ...overrides,
  };
}
