import type { CaseDetail, SiteMeasurementView, SiteOutcome, VisitView } from '@tidemark/shared';

/** An outcome as the server would send it; specs set only what they look at. */
export function outcome(overrides: Partial<SiteOutcome>): SiteOutcome {
  return { rebound: 0, retainedGain: 0, percentRetained: null, stability: 'stable', isFlaggedForReview: false, ...overrides };
}

function reading(id: number, siteId: number, refGm: number, result: SiteOutcome): SiteMeasurementView {
  return { id, siteId, refGm, probingDepth: null, bleedingOnProbing: null, ktWidth: null, papillaScore: null, outcome: result };
}

function visit(id: number, intervalKey: string, intervalLabel: string, visitDate: string, measurements: SiteMeasurementView[]): VisitView {
  return {
    id,
    intervalKey,
    intervalLabel,
    visitDate,
    examiner: { id: 5, displayName: 'Wren Adeyemi' },
    pain: null,
    satisfaction: null,
    notes: '',
    measurements,
    version: 1,
  };
}

/**
 * An invented case for specs: two sites (21 mid-facial, 22 mid-facial), recalls at 6 weeks
 * and 3 months. The outcomes are set by hand and deliberately do not all follow from the
 * readings, so a spec can tell "shown from the API" from "recomputed in the browser".
 */
export function caseDetailFixture(overrides: Partial<CaseDetail> = {}): CaseDetail {
  return {
    id: 12,
    patient: {
      id: 3,
      code: 'TST-0012',
      birthYear: 1984,
      sex: 'female',
      smoking: 'current',
      cigarettesPerDay: 8,
      diabetes: 'none',
      phenotype: 'thick',
      phenotypeMethod: 'probe-visibility',
      version: 1,
    },
    operator: { id: 5, displayName: 'Wren Adeyemi' },
    surgeryDate: '2026-01-05',
    procedure: 'gingivectomy',
    indication: 'aesthetic',
    instrument: 'scalpel',
    hygienePhaseComplete: true,
    bleedingScorePct: 12,
    plaqueScorePct: 18,
    deepestProbingMm: 3,
    sutureResorbable: null,
    sutureSize: null,
    provisionalRestorations: false,
    intraOperativeEvents: '',
    finalImpressionDate: null,
    finalRestorationDate: null,
    status: 'in-recall',
    withdrawnReason: null,
    notes: '',
    version: 4,
    sites: [
      {
        id: 101,
        tooth: 21,
        location: 'mid-facial',
        referencePoint: 'incisal-edge',
        baselineRefGm: 9,
        probingDepth: 2,
        ktWidth: 5,
        marginToCrest: 4,
        papillaScore: null,
        plannedExcision: 1.5,
        postOpRefGm: 11,
        crownGain: 2,
        version: 1,
      },
      {
        id: 102,
        tooth: 22,
        location: 'mid-facial',
        referencePoint: 'incisal-edge',
        baselineRefGm: 8.5,
        probingDepth: 2,
        ktWidth: 4,
        marginToCrest: 3.5,
        papillaScore: null,
        plannedExcision: 1,
        postOpRefGm: 10,
        crownGain: 1.5,
        version: 1,
      },
    ],
    // Listed out of schedule order on purpose: the grid orders columns by the schedule.
    visits: [
      visit(302, '3m', '3 months', '2026-04-06', [
        reading(3021, 101, 9.5, outcome({ rebound: 1.5, stability: 'relapse' })),
        reading(3022, 102, 10.5, outcome({ rebound: -0.5, stability: 'stable', isFlaggedForReview: true })),
      ]),
      visit(301, '6w', '6 weeks', '2026-02-16', [
        // Rebound 0.5 with class "minor": only the server's thresholds say so, the grid must not second-guess.
        reading(3011, 101, 10.5, outcome({ rebound: 0.5, stability: 'minor' })),
      ]),
    ],
    complications: [],
    photos: [],
    history: [],
    planningChecks: [],
    ...overrides,
  };
}
