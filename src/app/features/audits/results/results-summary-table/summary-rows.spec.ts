import { auditResults, groupedResults } from '../testing/results-fixtures';
import { WHOLE_COHORT, summaryRows } from './summary-rows';

describe('summaryRows', () => {
  it('gives the whole cohort at the chosen interval, worded with CIs', () => {
    const rows = summaryRows(auditResults(), { intervalKey: '6m', text: '' });
    expect(rows).toEqual([
      {
        id: 'All cases|6m',
        group: WHOLE_COHORT,
        interval: '6 months',
        nSites: 40,
        nPatients: 10,
        reboundSite: { value: '0.55 mm', ci: '0.45 to 0.65 mm' },
        reboundPatient: { value: '0.60 mm', ci: '0.40 to 0.80 mm' },
        stable: { value: '50.0%', ci: '40.0 to 60.0%' },
        minor: { value: '30.0%', ci: '20.0 to 40.0%' },
        relapse: { value: '20.0%', ci: '10.0 to 30.0%' },
        retained: { value: '62.5%', ci: '50.0 to 75.0%' },
      },
    ]);
  });

  it('adds one row per group when grouped, and every interval when asked', () => {
    expect(summaryRows(groupedResults(), { intervalKey: '6m', text: '' }).map((row) => row.group)).toEqual([WHOLE_COHORT, 'Thin', 'Thick']);
    expect(summaryRows(groupedResults(), { intervalKey: null, text: '' })).toHaveLength(9);
  });

  it('keeps only rows whose group or interval contains the typed words', () => {
    const rows = summaryRows(groupedResults(), { intervalKey: null, text: ' THICK 12 ' });
    expect(rows.map((row) => row.id)).toEqual(['Thick|12m']);
  });

  it('shows dashes for an interval without data', () => {
    const results = auditResults();
    const summary = { ...results.summary, intervals: [] };
    const [row] = summaryRows({ ...results, summary }, { intervalKey: '6m', text: '' });
    expect(row.nSites).toBe(0);
    expect(row.reboundPatient).toEqual({ value: '—', ci: null });
  });
});
