import { caseDetailFixture } from '../testing/case-detail-fixture';
import { addDays, recallTimeline, unscheduledVisits } from './recall-timeline';

describe('recallTimeline', () => {
  const { surgeryDate, visits } = caseDetailFixture();

  it('counts windows in calendar days from the surgery, across month ends', () => {
    expect(addDays('2026-01-05', 42)).toBe('2026-02-16');
    expect(addDays('2026-02-27', 2)).toBe('2026-03-01');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
  });

  it('places recorded visits and says where each other interval stands', () => {
    // Surgery 5 Jan 2026: the 6-month window (target 6 Jul) opens 15 Jun; 2 weeks closed 26 Jan.
    const steps = recallTimeline(surgeryDate, visits, '2026-06-20');
    expect(steps.map((step) => [step.interval.key, step.state, step.visit?.id ?? null])).toEqual([
      ['2w', 'closed', null],
      ['6w', 'recorded', 301],
      ['3m', 'recorded', 302],
      ['6m', 'open', null],
      ['12m', 'later', null],
    ]);
    expect(steps[3]).toMatchObject({ targetDate: '2026-07-06', windowOpens: '2026-06-15', windowCloses: '2026-08-05' });
  });

  it('keeps visits the schedule does not know', () => {
    const [first] = visits;
    if (!first) throw new Error('The fixture has visits.');
    const odd = { ...first, id: 999, intervalKey: '9m', intervalLabel: '9 months' };
    expect(unscheduledVisits([...visits, odd]).map((visit) => visit.id)).toEqual([999]);
  });
});
