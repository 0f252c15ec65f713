import { auditResults, groupedResults } from '../testing/results-fixtures';
import { WHOLE_COHORT_LABEL, cohortLabel } from '../cohort-label';
import { summaryRows } from './summary-rows';

describe('summaryRows', () => {
  it('gives the whole cohort at the chosen interval, worded with CIs', () => {
    const rows = summaryRows(auditResults(), { intervalKey: '6m', text: '' });
    expect(rows).toEqual([
      {
        id: 'All cases|6m',
        group: WHOLE_COHORT_LABEL,
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
    expect(summaryRows(groupedResults(), { intervalKey: '6m', text: '' }).map((row) => row.group)).toEqual([WHOLE_COHORT_LABEL, 'Thin', 'Thick']);
    expect(summaryRows(groupedResults(), { intervalKey: null, text: '' })).toHaveLength(9);
  });

  it('keeps only rows whose group or interval contains the typed words', () => {
    const rows = summaryRows(groupedResults(), { intervalKey: null, text: ' THICK 12 ' });
    expect(rows.map((row) => row.id)).toEqual(['Thick|12m']);
  });

  it('names the first row after the narrowed cohort, the way the drift legend names it, and keeps group rows as they are', () => {
    // Label words are the results filters' own (PHENOTYPE_LABELS in shared/types/clinical-terms.ts, operator choice labels).
    const narrowed = cohortLabel('thin', 5, [{ id: 5, label: 'Wren Adeyemi' }]);
    expect(narrowed).toBe('Thin (≤ 1 mm) · Wren Adeyemi');
    const rows = summaryRows(groupedResults(), { intervalKey: '6m', text: '', cohortLabel: narrowed });
    expect(rows.map((row) => row.group)).toEqual(['Thin (≤ 1 mm) · Wren Adeyemi', 'Thin', 'Thick']);
    expect(rows[0].id).toBe('Thin (≤ 1 mm) · Wren Adeyemi|6m');
    expect(rows.some((row) => row.group === WHOLE_COHORT_LABEL)).toBe(false);
    // The typed words find the narrowed row by its new name.
    expect(summaryRows(auditResults(), { intervalKey: null, text: 'adeyemi', cohortLabel: narrowed })).toHaveLength(3);
  });

  it('calls the first row "All cases" when nothing narrows the results', () => {
    expect(summaryRows(auditResults(), { intervalKey: '6m', text: '', cohortLabel: cohortLabel(null, null, []) })[0].group).toBe('All cases');
    expect(summaryRows(auditResults(), { intervalKey: '6m', text: '' })[0].group).toBe('All cases');
  });

  it('shows dashes for an interval without data', () => {
    const results = auditResults();
    const summary = { ...results.summary, intervals: [] };
    const [row] = summaryRows({ ...results, summary }, { intervalKey: '6m', text: '' });
    expect(row.nSites).toBe(0);
    expect(row.reboundPatient).toEqual({ value: '—', ci: null });
  });
});
