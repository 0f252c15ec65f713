import type {
  CaseStatus,
  ClavienDindoGrade,
  ComplicationType,
  DiabetesStatus,
  Indication,
  Instrument,
  Phenotype,
  PhenotypeMethod,
  PhotoKind,
  Procedure,
  ReferencePoint,
  Sex,
  SiteLocation,
  SmokingStatus,
} from '@tidemark/shared';
import { DEFAULT_RECALL_SCHEDULE } from '@tidemark/shared';
import { SeededRandom } from './seeded-random';

/**
 * The invented demo practice "Harbourside Periodontal Partners" (DESIGN.md §9): four
 * operators, about 150 cases over 18 months up to `today`, generated deterministically.
 * Plausible, not real: mean rebound near 0.8 mm at 6 months (Arora et al. 2013 report
 * 0.77 ± 0.58 mm), more on a thick phenotype (Pontoriero & Carnevale 2001) and where a
 * gingivectomy left the margin under ~3 mm from the crest; some missed recalls; a few
 * complications of grades I–IIIa. Never used as check values.
 */

export interface DemoSite {
  tooth: number;
  location: SiteLocation;
  referencePoint: ReferencePoint;
  baselineRefGm: number;
  probingDepth: number;
  ktWidth: number;
  marginToCrest: number;
  papillaScore: number | null;
  plannedExcision: number;
  postOpRefGm: number | null;
}

export interface DemoVisit {
  intervalKey: string;
  visitDate: string;
  pain: number;
  satisfaction: number;
  measurements: { siteIndex: number; refGm: number; probingDepth: number; bleedingOnProbing: boolean; ktWidth: number; papillaScore: number | null }[];
}

export interface DemoComplication {
  type: ComplicationType;
  grade: ClavienDindoGrade;
  onsetDate: string;
  resolutionDate: string | null;
  management: string;
  intervalKey: string | null;
}

export interface DemoCase {
  patientIndex: number;
  /** Index into the operator list (0 = the demo clinician, 1 = the audit lead, 2–3 = other operators). */
  operatorIndex: number;
  surgeryDate: string;
  procedure: Procedure;
  indication: Indication;
  instrument: Instrument;
  hygienePhaseComplete: boolean;
  bleedingScorePct: number;
  plaqueScorePct: number;
  deepestProbingMm: number;
  sutureResorbable: boolean;
  sutureSize: string;
  provisionalRestorations: boolean;
  finalImpressionDate: string | null;
  finalRestorationDate: string | null;
  status: CaseStatus;
  withdrawnReason: string | null;
  sites: DemoSite[];
  visits: DemoVisit[];
  complications: DemoComplication[];
  photoKinds: PhotoKind[];
}

export interface DemoPatient {
  code: string;
  birthYear: number;
  sex: Sex;
  smoking: SmokingStatus;
  cigarettesPerDay: number | null;
  diabetes: DiabetesStatus;
  phenotype: Phenotype;
  phenotypeMethod: PhenotypeMethod;
}

export interface DemoPractice {
  patients: DemoPatient[];
  cases: DemoCase[];
}

/** The fixed seed: same practice on every machine for the same `today`. */
export const DEMO_SEED = 20261202;
const CASE_COUNT = 150;
const SPAN_DAYS = 548; // about 18 months
const DAY_MS = 86_400_000;

/** Share of the final rebound reached at each interval (coronal creep slows over 12 months; common practice). */
const REBOUND_FRACTION: Readonly<Record<string, number>> = { '2w': 0.25, '6w': 0.5, '3m': 0.72, '6m': 0.9, '12m': 1 };

function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** Rounds to the 0.5 mm a probe is read to. */
function toHalf(mm: number): number {
  return Math.min(20, Math.max(0, Math.round(mm * 2) / 2));
}

const ANTERIOR_TEETH = [13, 12, 11, 21, 22, 23];
const RESTORATIVE_TEETH = [14, 15, 16, 24, 25, 26, 34, 35, 36, 44, 45, 46, 12, 22];

function makePatient(random: SeededRandom, index: number): DemoPatient {
  const smoking = random.weighted<SmokingStatus>([['never', 70], ['former', 18], ['current', 12]]);
  return {
    code: `HP-${String(index + 1).padStart(4, '0')}`,
    birthYear: random.int(1955, 2002),
    sex: random.weighted<Sex>([['female', 58], ['male', 40], ['unspecified', 2]]),
    smoking,
    cigarettesPerDay: smoking === 'current' ? random.int(3, 20) : null,
    diabetes: random.weighted<DiabetesStatus>([['none', 90], ['controlled', 7], ['uncontrolled', 3]]),
    phenotype: random.weighted<Phenotype>([['thin', 55], ['thick', 45]]),
    phenotypeMethod: random.weighted<PhenotypeMethod>([['probe-visibility', 70], ['transgingival-probing', 20], ['visual', 10]]),
  };
}

function makeSites(random: SeededRandom, indication: Indication, procedure: Procedure): DemoSite[] {
  const isAesthetic = indication === 'aesthetic';
  const teeth = isAesthetic
    ? ANTERIOR_TEETH.slice(random.pick([0, 1, 2]), random.pick([4, 5, 6]))
    : [random.pick(RESTORATIVE_TEETH), ...(random.chance(0.3) ? [random.pick(RESTORATIVE_TEETH)] : [])];
  const sites: DemoSite[] = [];
  for (const tooth of [...new Set(teeth)]) {
    const gain = toHalf(random.normal(isAesthetic ? 2 : 2.5, 0.5));
    const baseline = toHalf(random.normal(isAesthetic ? 8.5 : 7.5, 0.8));
    const kt = toHalf(random.normal(5, 1));
    // Gingivectomy alone sometimes leaves the margin close to the crest; flaps with recontouring rarely do.
    const crestAfter = procedure === 'apf-osseous-recontouring' ? random.normal(3.2, 0.3) : random.normal(3, 0.7);
    const base: DemoSite = {
      tooth,
      location: 'mid-facial',
      referencePoint: isAesthetic ? 'incisal-edge' : random.pick<ReferencePoint>(['cusp-tip', 'restoration-margin', 'stent']),
      baselineRefGm: baseline,
      probingDepth: toHalf(random.normal(2.5, 0.5)),
      ktWidth: Math.max(1, kt),
      marginToCrest: toHalf(crestAfter + gain),
      papillaScore: null,
      plannedExcision: gain,
      postOpRefGm: toHalf(baseline + gain),
    };
    sites.push(base);
    if (isAesthetic && (tooth === 11 || tooth === 21 || random.chance(0.3))) {
      sites.push({ ...base, location: 'mesial-papilla', baselineRefGm: toHalf(baseline - 3), postOpRefGm: toHalf(baseline - 3 + gain * 0.5), papillaScore: random.weighted([[2, 30], [3, 60], [4, 10]]), plannedExcision: toHalf(gain * 0.5) });
    }
  }
  return sites;
}

/** Generates the demo practice as plain data (no I/O). */
export function generateDemoPractice(today: string, seed = DEMO_SEED): DemoPractice {
  const random = new SeededRandom(seed);
  const patients: DemoPatient[] = [];
  const cases: DemoCase[] = [];
  const start = addDays(today, -SPAN_DAYS);
  for (let index = 0; index < CASE_COUNT; index++) {
    // A few patients come back for a second case.
    const isReturning = patients.length > 10 && random.chance(0.07);
    const patientIndex = isReturning ? random.int(0, patients.length - 1) : patients.push(makePatient(random, patients.length)) - 1;
    const patient = patients[patientIndex];
    const isPlanned = index >= CASE_COUNT - 4;
    const surgeryDate = isPlanned ? addDays(today, random.int(3, 20)) : addDays(start, Math.floor((index / (CASE_COUNT - 4)) * (SPAN_DAYS - 3)));
    const indication = random.weighted<Indication>([['aesthetic', 60], ['restorative-caries', 13], ['restorative-fracture', 11], ['restorative-ferrule', 12], ['other', 4]]);
    const procedure = random.weighted<Procedure>(
      indication === 'aesthetic'
        ? [['gingivectomy', 65], ['apically-positioned-flap', 15], ['apf-osseous-recontouring', 18], ['other', 2]]
        : [['gingivectomy', 20], ['apically-positioned-flap', 25], ['apf-osseous-recontouring', 50], ['other', 5]],
    );
    const operatorIndex = random.weighted([[0, 30], [1, 25], [2, 25], [3, 20]]);
    const sites = makeSites(random, indication, procedure);
    const finalRebound = sites.map((site) => {
      const crestAfter = site.marginToCrest - site.plannedExcision;
      const mean = 0.66 + (patient.phenotype === 'thick' ? 0.35 : 0) + (procedure === 'gingivectomy' && crestAfter < 3 ? 0.45 : 0) + (patient.smoking === 'current' ? 0.1 : 0);
      return random.normal(mean, 0.45);
    });
    const visits: DemoVisit[] = [];
    const complications: DemoComplication[] = [];
    if (!isPlanned) {
      const missesMany = random.chance(0.06);
      for (const interval of DEFAULT_RECALL_SCHEDULE) {
        const target = addDays(surgeryDate, interval.targetDays);
        const isLate = random.chance(0.06);
        const offset = isLate ? interval.windowAfterDays + random.int(3, 20) : random.int(-interval.windowBeforeDays, Math.ceil(interval.windowAfterDays * 0.6));
        const visitDate = addDays(target, offset);
        if (visitDate > today) break;
        if (random.chance(missesMany ? 0.5 : 0.09)) continue;
        const fraction = REBOUND_FRACTION[interval.key] ?? 1;
        visits.push({
          intervalKey: interval.key,
          visitDate,
          pain: interval.key === '2w' ? Math.min(10, Math.max(0, Math.round(random.normal(2.5, 2)))) : Math.max(0, Math.round(random.normal(0.5, 0.8))),
          satisfaction: Math.min(10, Math.max(3, Math.round(random.normal(8.3, 1.2)))),
          measurements: sites.map((site, siteIndex) => ({
            siteIndex,
            refGm: toHalf((site.postOpRefGm ?? site.baselineRefGm) - finalRebound[siteIndex] * fraction + random.normal(0, 0.2)),
            probingDepth: toHalf(random.normal(1.8 + fraction * 0.4, 0.4)),
            bleedingOnProbing: random.chance(interval.key === '2w' ? 0.35 : 0.12),
            ktWidth: Math.max(0.5, toHalf(site.ktWidth - site.plannedExcision + random.normal(0.3, 0.3))),
            papillaScore: site.papillaScore === null ? null : Math.min(4, Math.max(0, site.papillaScore - (fraction < 0.6 ? 1 : 0) + (random.chance(0.15) ? -1 : 0))),
          })),
        });
      }
      if (random.chance(0.12)) {
        const grade = random.weighted<ClavienDindoGrade>([['I', 50], ['II', 30], ['IIIa', 20]]);
        const type = random.weighted<ComplicationType>([['pain', 25], ['delayed-healing', 25], ['infection', 12], ['bleeding', 10], ['hypersensitivity', 12], ['recession', 8], ['open-embrasure', 8]]);
        const onsetDate = addDays(surgeryDate, random.int(1, 20));
        if (onsetDate <= today) {
          const resolutionDate = addDays(onsetDate, random.int(3, 30));
          complications.push({
            type,
            grade,
            onsetDate,
            resolutionDate: resolutionDate <= today ? resolutionDate : null,
            management: grade === 'I' ? 'Analgesics and chlorhexidine rinse; reviewed.' : grade === 'II' ? 'Systemic antibiotic course; reviewed.' : 'Re-sutured under local anaesthesia.',
            intervalKey: visits[0]?.visitDate && visits[0].visitDate >= onsetDate ? visits[0].intervalKey : null,
          });
        }
      }
    }
    const isRestorative = indication.startsWith('restorative');
    const impressionDays = random.chance(0.12) ? random.int(21, 38) : random.int(45, 120);
    const finalImpressionDate = isRestorative && addDays(surgeryDate, impressionDays) <= today ? addDays(surgeryDate, impressionDays) : null;
    const finalRestorationDate = finalImpressionDate && addDays(finalImpressionDate, 21) <= today ? addDays(finalImpressionDate, 21) : null;
    const isWithdrawn = !isPlanned && visits.length <= 1 && random.chance(0.25) && surgeryDate < addDays(today, -200);
    const status: CaseStatus = isPlanned
      ? 'planned'
      : isWithdrawn
        ? 'withdrawn'
        : visits.some((visit) => visit.intervalKey === '12m')
          ? 'concluded'
          : visits.length
            ? 'in-recall'
            : 'operated';
    cases.push({
      patientIndex,
      operatorIndex,
      surgeryDate,
      procedure,
      indication,
      instrument: random.weighted<Instrument>([['scalpel', 70], ['electrosurgery', 15], ['laser', 15]]),
      hygienePhaseComplete: random.chance(0.95),
      bleedingScorePct: Math.max(2, Math.round(random.normal(12, 6))),
      plaqueScorePct: Math.max(5, Math.round(random.normal(18, 7))),
      deepestProbingMm: toHalf(random.normal(3, 0.5)),
      sutureResorbable: random.chance(0.7),
      sutureSize: random.pick(['5-0', '6-0', '6-0', '7-0']),
      provisionalRestorations: isRestorative || random.chance(0.2),
      finalImpressionDate,
      finalRestorationDate,
      status,
      withdrawnReason: isWithdrawn ? 'Moved away; care transferred.' : null,
      sites: isPlanned ? sites.map((site) => ({ ...site, postOpRefGm: null })) : sites,
      visits: isWithdrawn ? visits.slice(0, 1) : visits,
      complications,
      photoKinds: index % 12 === 5 && !isPlanned ? ['pre-operative', 'post-operative'] : [],
    });
  }
  return { patients, cases };
}
