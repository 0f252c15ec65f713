import type { SiteView, VisitView } from '@tidemark/shared';
import { isLargeChange, previousReadings, recallWindow, scheduleInterval, windowTiming } from './recall-context';

const site = (id: number, postOpRefGm: number | null): SiteView => ({
  id,
  tooth: 21,
  location: 'mid-facial',
  referencePoint: 'incisal-edge',
  baselineRefGm: 8,
  probingDepth: null,
  ktWidth: null,
  marginToCrest: null,
  papillaScore: null,
  plannedExcision: null,
  postOpRefGm,
  crownGain: null,
  version: 1,
});

const visit = (id: number, intervalLabel: string, visitDate: string, readings: [number, number][]): VisitView => ({
  id,
  intervalKey: intervalLabel,
  intervalLabel,
  visitDate,
  examiner: { id: 1, displayName: 'Examiner' },
  pain: null,
  satisfaction: null,
  notes: '',
  measurements: readings.map(([siteId, refGm], index) => ({
    id: index + 1,
    siteId,
    refGm,
    probingDepth: null,
    bleedingOnProbing: null,
    ktWidth: null,
    papillaScore: null,
    outcome: { rebound: null, retainedGain: 0, percentRetained: null, stability: null, isFlaggedForReview: false },
  })),
  version: 1,
});

const detailWith = (sites: SiteView[], visits: VisitView[]) => ({ sites, visits });

describe('recall context', () => {
  it('places the 6-week window around surgery + 42 days (DEFAULT_RECALL_SCHEDULE: −7/+14 days)', () => {
    const interval = scheduleInterval('6w');
    expect(interval).not.toBeNull();
    // 2026-01-01 + 42 days = 2026-02-12 (calendar arithmetic, checked by hand).
    const window = interval ? recallWindow('2026-01-01', interval) : null;
    expect(window).toEqual({ targetDate: '2026-02-12', opens: '2026-02-05', closes: '2026-02-26' });
    if (window) {
      expect(windowTiming(window, '2026-02-05')).toEqual({ kind: 'in-window' });
      expect(windowTiming(window, '2026-02-02')).toEqual({ kind: 'early', days: 3 });
      expect(windowTiming(window, '2026-03-01')).toEqual({ kind: 'late', days: 3 });
    }
    expect(scheduleInterval('5y')).toBeNull();
  });

  it('compares with the latest earlier visit, else post-op, leaving out the visit being corrected', () => {
    const detail = detailWith(
      [site(1, 10), site(2, 9), site(3, null)],
      [visit(10, '2 weeks', '2026-01-15', [[1, 9.5]]), visit(11, '6 weeks', '2026-02-12', [[1, 9], [2, 8.5]])],
    );
    const after = previousReadings(detail, '2026-04-01', null);
    expect(after.get(1)).toEqual({ refGm: 9, source: '6 weeks recall' });
    expect(after.get(2)).toEqual({ refGm: 8.5, source: '6 weeks recall' });
    expect(after.has(3)).toBe(false);

    const correctingSixWeeks = previousReadings(detail, '2026-02-12', 11);
    expect(correctingSixWeeks.get(1)).toEqual({ refGm: 9.5, source: '2 weeks recall' });
    expect(correctingSixWeeks.get(2)).toEqual({ refGm: 9, source: 'post-op' });
  });

  it('calls a change large only beyond 3 mm (DESIGN.md §3)', () => {
    const previous = { refGm: 10, source: 'post-op' };
    expect(isLargeChange(13, previous)).toBe(false);
    expect(isLargeChange(13.5, previous)).toBe(true);
    expect(isLargeChange(6.5, previous)).toBe(true);
    expect(isLargeChange(20, null)).toBe(false);
  });
});
