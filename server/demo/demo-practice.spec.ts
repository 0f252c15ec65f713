import { isValidFdiTooth } from '@tidemark/analytics';
import { siteFieldsSchema } from '@tidemark/shared';
import { generateDemoPractice } from './demo-practice';

// The demo practice is invented (DESIGN.md §9); these checks keep it plausible, they are not check values.
describe('generateDemoPractice', () => {
  const today = '2026-12-02';
  const practice = generateDemoPractice(today);

  it('is deterministic for a given day', () => {
    expect(generateDemoPractice(today)).toEqual(practice);
  });

  it('has about 150 cases over 18 months for four operators', () => {
    expect(practice.cases).toHaveLength(150);
    expect(new Set(practice.cases.map((demoCase) => demoCase.operatorIndex))).toEqual(new Set([0, 1, 2, 3]));
    const dates = practice.cases.map((demoCase) => demoCase.surgeryDate).sort();
    expect(dates[0] >= '2025-06-01').toBe(true);
    expect(practice.cases.filter((demoCase) => demoCase.status === 'planned').every((demoCase) => demoCase.surgeryDate > today)).toBe(true);
  });

  it('produces valid sites, teeth and dates', () => {
    for (const demoCase of practice.cases) {
      for (const site of demoCase.sites) {
        expect(isValidFdiTooth(site.tooth)).toBe(true);
        expect(siteFieldsSchema.safeParse(site).success).toBe(true);
      }
      for (const visit of demoCase.visits) {
        expect(visit.visitDate >= demoCase.surgeryDate && visit.visitDate <= today).toBe(true);
      }
    }
  });

  it('gives a mean 6-month rebound near 0.8 mm, more on a thick phenotype, and some missed recalls', () => {
    const rebounds = { thin: [] as number[], thick: [] as number[] };
    let missed = 0;
    for (const demoCase of practice.cases) {
      const phenotype = practice.patients[demoCase.patientIndex].phenotype;
      const sixMonths = demoCase.visits.find((visit) => visit.intervalKey === '6m');
      if (!sixMonths && demoCase.surgeryDate < '2026-04-01' && demoCase.status !== 'planned') missed++;
      for (const measurement of sixMonths?.measurements ?? []) {
        const site = demoCase.sites[measurement.siteIndex];
        if (site.postOpRefGm !== null) rebounds[phenotype].push(site.postOpRefGm - measurement.refGm);
      }
    }
    const mean = (values: number[]) => values.reduce((sum, value) => sum + value, 0) / values.length;
    const all = [...rebounds.thin, ...rebounds.thick];
    expect(mean(all)).toBeGreaterThan(0.65);
    expect(mean(all)).toBeLessThan(0.95);
    expect(mean(rebounds.thick)).toBeGreaterThan(mean(rebounds.thin));
    expect(missed).toBeGreaterThan(3);
  });

  it('includes complications of grades I, II and IIIa', () => {
    const grades = new Set(practice.cases.flatMap((demoCase) => demoCase.complications.map((complication) => complication.grade)));
    expect(grades).toEqual(new Set(['I', 'II', 'IIIa']));
  });
});
