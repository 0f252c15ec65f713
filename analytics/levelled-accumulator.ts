import type { LevelledSummary } from '../shared/types/outcome-record';
import { describe } from './describe';

/** Room for this many sites before the first doubling; 16k sites cost 192 kB. */
const INITIAL_CAPACITY = 16_384;

/**
 * Collects one measure per site, tagged with the site's patient, then describes it
 * at site level and at patient level (the mean of each patient's sites), because
 * several sites of one patient are correlated (DESIGN.md §3). Values live in
 * growable typed arrays, so a 100,000-site cohort costs no per-row allocations.
 */
export class LevelledAccumulator {
  private values = new Float64Array(INITIAL_CAPACITY);
  private patients = new Int32Array(INITIAL_CAPACITY);
  private count = 0;

  /** Adds one site's value for patient slot `patient` (0-based, numbered by the caller). */
  add(value: number, patient: number): void {
    if (this.count === this.values.length) this.grow();
    this.values[this.count] = value;
    this.patients[this.count] = patient;
    this.count++;
  }

  /**
   * Site-level and patient-level descriptive statistics (null when nothing was added).
   *
   * @param patientSlots number of patient slots in use (every slot added is below it)
   */
  summarise(patientSlots: number): LevelledSummary {
    const sums = new Float64Array(patientSlots);
    const siteCounts = new Int32Array(patientSlots);
    let nPatients = 0;
    for (let i = 0; i < this.count; i++) {
      const patient = this.patients[i];
      if (siteCounts[patient]++ === 0) nPatients++;
      sums[patient] += this.values[i];
    }
    const patientMeans = new Float64Array(nPatients);
    for (let patient = 0, j = 0; patient < patientSlots; patient++) {
      if (siteCounts[patient] > 0) patientMeans[j++] = sums[patient] / siteCounts[patient];
    }
    return {
      nSites: this.count,
      nPatients,
      site: this.count > 0 ? describe(this.values.subarray(0, this.count)) : null,
      patient: nPatients > 0 ? describe(patientMeans) : null,
    };
  }

  private grow(): void {
    const values = new Float64Array(this.values.length * 2);
    values.set(this.values);
    this.values = values;
    const patients = new Int32Array(this.patients.length * 2);
    patients.set(this.patients);
    this.patients = patients;
  }
}
