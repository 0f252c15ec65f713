import type { LevelledSummary } from '../shared/types/outcome-record';
import { describe } from './describe';

/**
 * Collects one measure at site level and per patient, then describes both: the
 * patient level is the mean of each patient's sites, because several sites of one
 * patient are correlated (DESIGN.md §3). Typed arrays sized up front keep a
 * 100,000-site cohort free of per-row allocations.
 */
export class LevelledAccumulator {
  private readonly siteValues: Float64Array;
  private siteCount = 0;
  private readonly patientSums: Float64Array;
  private readonly patientSiteCounts: Int32Array;
  private readonly patientsSeen: Int32Array;
  private patientCount = 0;

  /**
   * @param capacity the most sites that will be added
   * @param patientSlots patients are numbered 0 … patientSlots − 1 by the caller
   */
  constructor(capacity: number, patientSlots: number) {
    this.siteValues = new Float64Array(capacity);
    this.patientSums = new Float64Array(patientSlots);
    this.patientSiteCounts = new Int32Array(patientSlots);
    this.patientsSeen = new Int32Array(Math.min(capacity, patientSlots));
  }

  /** Adds one site's value for patient slot `patient`. */
  add(value: number, patient: number): void {
    this.siteValues[this.siteCount++] = value;
    if (this.patientSiteCounts[patient]++ === 0) this.patientsSeen[this.patientCount++] = patient;
    this.patientSums[patient] += value;
  }

  /** Site-level and patient-level descriptive statistics (null when nothing was added). */
  summarise(): LevelledSummary {
    const patientMeans = new Float64Array(this.patientCount);
    for (let i = 0; i < this.patientCount; i++) {
      const patient = this.patientsSeen[i];
      patientMeans[i] = this.patientSums[patient] / this.patientSiteCounts[patient];
    }
    return {
      nSites: this.siteCount,
      nPatients: this.patientCount,
      site: this.siteCount > 0 ? describe(this.siteValues.subarray(0, this.siteCount)) : null,
      patient: this.patientCount > 0 ? describe(patientMeans) : null,
    };
  }
}
