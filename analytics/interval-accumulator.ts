import type {
  IntervalOutcomeSummary,
  OutcomeRecord,
  RecallInterval,
  StabilityThresholds,
} from '../shared/types/outcome-record';
import { LevelledAccumulator } from './levelled-accumulator';
import { proportionEstimate } from './proportion-estimate';
import { STABILITY_TOLERANCE_MM } from './stability-class';

/** Highest Jemt papilla index. */
const MAX_PAPILLA = 4;

/**
 * Gathers the margin and papilla outcomes of one recall interval, one validated
 * record at a time, and turns them into an {@link IntervalOutcomeSummary}.
 * Rebound = post-op − recall, retained gain = recall − baseline, % retained =
 * retained / gain × 100 (zero-gain sites left out), on every row that has both
 * post-op and recall REF→GM, whatever the site's location (DESIGN.md §3).
 */
export class IntervalAccumulator {
  private nRecords = 0;
  private readonly rebound = new LevelledAccumulator();
  private readonly retainedGain = new LevelledAccumulator();
  private readonly percentRetained = new LevelledAccumulator();
  private readonly papillaScore = new LevelledAccumulator();
  private readonly papillaChange = new LevelledAccumulator();
  private stable = 0;
  private minor = 0;
  private relapse = 0;
  private flaggedForReview = 0;
  /** Class limits with the same rounding slack as `stabilityClass`. */
  private readonly stableLimit: number;
  private readonly relapseLimit: number;
  private readonly papillaCounts = new Int32Array(MAX_PAPILLA + 1);
  private improved = 0;
  private unchanged = 0;
  private worsened = 0;

  /**
   * @param interval the recall interval summarised
   * @param thresholds stability thresholds, already validated
   */
  constructor(
    private readonly interval: RecallInterval,
    private readonly thresholds: StabilityThresholds,
  ) {
    this.stableLimit = thresholds.stable + STABILITY_TOLERANCE_MM;
    this.relapseLimit = thresholds.relapse + STABILITY_TOLERANCE_MM;
  }

  /** Adds one record of this interval; `patient` is the caller's 0-based patient slot. */
  add(record: OutcomeRecord, patient: number): void {
    this.nRecords++;
    const { baselineRefGm: baseline, postOpRefGm: postOp, recallRefGm: recall } = record;
    // Plain arithmetic rather than crownGain/rebound/…: the caller validated the row
    // once, and this runs half a million times for a large cohort.
    if (postOp !== null && recall !== null) {
      const reboundMm = postOp - recall;
      const retainedMm = recall - baseline;
      const gain = postOp - baseline;
      this.rebound.add(reboundMm, patient);
      this.retainedGain.add(retainedMm, patient);
      if (gain !== 0) this.percentRetained.add((retainedMm / gain) * 100, patient);
      // Same rule as stabilityClass, without re-checking the thresholds on every row.
      if (reboundMm <= this.stableLimit) this.stable++;
      else if (reboundMm <= this.relapseLimit) this.minor++;
      else this.relapse++;
      if (reboundMm < 0) this.flaggedForReview++;
    }
    const { recallPapilla, baselinePapilla } = record;
    if (recallPapilla !== null) {
      this.papillaCounts[recallPapilla]++;
      this.papillaScore.add(recallPapilla, patient);
      if (baselinePapilla !== null) {
        const change = recallPapilla - baselinePapilla;
        this.papillaChange.add(change, patient);
        if (change > 0) this.improved++;
        else if (change < 0) this.worsened++;
        else this.unchanged++;
      }
    }
  }

  /**
   * The interval's summary.
   *
   * @param patientSlots number of patient slots in use
   */
  summarise(patientSlots: number): IntervalOutcomeSummary {
    const rebound = this.rebound.summarise(patientSlots);
    const score = this.papillaScore.summarise(patientSlots);
    return {
      intervalKey: this.interval.key,
      label: this.interval.label,
      targetDays: this.interval.targetDays,
      nRecords: this.nRecords,
      nSites: rebound.nSites,
      nPatients: rebound.nPatients,
      rebound,
      retainedGain: this.retainedGain.summarise(patientSlots),
      percentRetained: this.percentRetained.summarise(patientSlots),
      stability: {
        thresholds: this.thresholds,
        stable: proportionEstimate(this.stable, rebound.nSites),
        minor: proportionEstimate(this.minor, rebound.nSites),
        relapse: proportionEstimate(this.relapse, rebound.nSites),
        flaggedForReview: proportionEstimate(this.flaggedForReview, rebound.nSites),
      },
      papilla: {
        nSites: score.nSites,
        nPatients: score.nPatients,
        score,
        distribution: [...this.papillaCounts].map((count, value) => ({ score: value, estimate: proportionEstimate(count, score.nSites) })),
        change: this.papillaChange.summarise(patientSlots),
        improved: this.improved,
        unchanged: this.unchanged,
        worsened: this.worsened,
      },
    };
  }
}
