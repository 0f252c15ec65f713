import type { AuditResults, CalibrationResult, CycleComparison, FunnelResult, GroupBy, ResultGroup, SurvivalResult, TrendResult } from '@tidemark/shared';
import { INDICATION_LABELS, PHENOTYPE_LABELS, PROCEDURE_LABELS, SMOKING_LABELS, STANDARD_METRIC_INFO } from '@tidemark/shared';
import type { StandardResult, StandardView } from '@tidemark/shared';
import {
  calibrationAgreement,
  cohortCounts,
  compareStandard,
  groupDataset,
  monthlyTrend,
  operatorFunnel,
  reboundHistogram,
  standardResult,
  summariseOutcomes,
  timeToRelapse,
} from '@tidemark/analytics';
import type { AuditDataset, ResultsNarrowing } from '@tidemark/shared';
import { todayIso } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { assertAuditReader } from './audit-access';
import type { AuditCycleService, AuditSnapshot } from './audit-cycle.service';
import type { AuditResultsCache, ResultsCacheStats } from './audit-results-cache';
import type { AuditService } from './audit.service';
import type { OperatorDirectory } from './operator-directory';
import { operatorLabeler } from './operator-labels';
import { assertMayNarrow, narrowSnapshot, narrowingVariant, operatorIdsOf } from './results-narrowing';

/** Which data to read: live, or a cycle (frozen once reported), optionally narrowed to a phenotype and/or an operator. */
export interface ResultScope extends ResultsNarrowing {
  cycleId?: number;
}

interface ResolvedScope {
  /** Narrowed when the scope asks for it. */
  snapshot: AuditSnapshot;
  cycleId: number | null;
  frozenAt: string | null;
  /** Every operator of the un-narrowed dataset: letters follow all of them, so a narrowing never re-letters anyone. */
  operatorIds: number[];
}

const GROUP_LABELS: Record<Exclude<GroupBy, 'operator'>, Readonly<Record<string, string>>> = {
  procedure: PROCEDURE_LABELS,
  phenotype: PHENOTYPE_LABELS,
  indication: INDICATION_LABELS,
  smoking: SMOKING_LABELS,
};

/**
 * The results as computed, before anything that depends on the viewer: with groupBy=operator the
 * group keys are operator ids, relabelled per request (names, "(you)", letters).
 */
export interface ComputedResults {
  results: AuditResults;
  /** Operators of the dataset's cases, for the letters (which follow the ids of all of them). */
  operatorIds: number[];
}

/** Every figure of an audit, computed by analytics/ from a live or frozen dataset. */
export class AuditResultsService {
  constructor(
    private readonly audits: AuditService,
    private readonly cycles: AuditCycleService,
    private readonly operators: OperatorDirectory,
    private readonly cache: AuditResultsCache<ComputedResults>,
  ) {}

  private async resolve(user: Express.User, auditId: number, scope: ResultScope, asOf = todayIso()): Promise<ResolvedScope> {
    assertMayNarrow(user, scope);
    const whole = await this.resolveWhole(user, auditId, scope, asOf);
    return { ...whole, snapshot: narrowSnapshot(whole.snapshot, scope), operatorIds: operatorIdsOf(whole.snapshot.dataset) };
  }

  private async resolveWhole(user: Express.User, auditId: number, scope: ResultScope, asOf: string): Promise<Omit<ResolvedScope, 'operatorIds'>> {
    assertAuditReader(user);
    const audit = await this.audits.findAudit(auditId);
    if (scope.cycleId === undefined) return { snapshot: await this.cycles.liveSnapshot(audit, undefined, asOf), cycleId: null, frozenAt: null };
    const cycle = await this.cycles.findCycle(scope.cycleId);
    if (cycle.auditId !== auditId) throw HttpError.notFound('The audit cycle');
    const frozen = this.cycles.frozenSnapshot(cycle);
    if (frozen) return { snapshot: frozen, cycleId: cycle.id, frozenAt: cycle.frozenAt ? new Date(cycle.frozenAt).toISOString() : null };
    return { snapshot: await this.cycles.liveSnapshot(audit, { start: cycle.periodStart, end: cycle.periodEnd }, asOf), cycleId: cycle.id, frozenAt: null };
  }

  private async labeler(user: Express.User, ids: number[]) {
    const names = await this.operators.lookup(ids);
    return operatorLabeler(user, ids, (id) => names(id).displayName);
  }

  private summarise(dataset: AuditDataset) {
    return summariseOutcomes(dataset.records, { cases: dataset.cases, schedule: dataset.schedule, thresholds: dataset.thresholds, asOf: dataset.asOf });
  }

  /**
   * The results board. Served from the cache while the data generation is unchanged (see
   * {@link AuditResultsCache} for the rule); operator labels are applied per request.
   */
  async results(user: Express.User, auditId: number, scope: ResultScope & { groupBy?: GroupBy }): Promise<AuditResults> {
    assertAuditReader(user);
    // Before the cache: an entry narrowed to one operator must never reach a viewer who may not ask for it.
    assertMayNarrow(user, scope);
    const groupBy = scope.groupBy ?? null;
    const asOf = todayIso();
    const variant = `${groupBy ?? 'all'}${narrowingVariant(scope)}`;
    const { results, operatorIds } = await this.cache.getOrCompute({ auditId, cycleId: scope.cycleId ?? null, variant, asOf }, () =>
      this.computeResults(user, auditId, scope, asOf),
    );
    if (groupBy !== 'operator') return results;
    const names = await this.operators.lookup(operatorIds);
    const label = operatorLabeler(user, operatorIds, (id) => names(id).displayName);
    return {
      ...results,
      groups: results.groups.map((group) => {
        const name = label(Number(group.key)).label;
        return { ...group, key: name, label: name };
      }),
    };
  }

  /** Hits and misses of the results cache. */
  cacheStats(): ResultsCacheStats {
    return this.cache.stats();
  }

  private async computeResults(user: Express.User, auditId: number, scope: ResultScope & { groupBy?: GroupBy }, asOf: string): Promise<ComputedResults> {
    const { snapshot, cycleId, frozenAt, operatorIds } = await this.resolve(user, auditId, scope, asOf);
    const { dataset } = snapshot;
    let groups: ResultGroup[] = [];
    if (scope.groupBy === 'operator') {
      groups = groupDataset(dataset, 'operator').map((group) => ({ key: group.key, label: group.key, summary: this.summarise(group.dataset) }));
    } else if (scope.groupBy) {
      const labels = GROUP_LABELS[scope.groupBy];
      groups = groupDataset(dataset, scope.groupBy).map((group) => ({ key: group.key, label: labels[group.key] ?? group.key, summary: this.summarise(group.dataset) }));
    }
    const results: AuditResults = {
      auditId,
      cycleId,
      frozenAt,
      asOf: dataset.asOf,
      cohort: cohortCounts(dataset),
      thresholds: dataset.thresholds,
      schedule: dataset.schedule,
      summary: this.summarise(dataset),
      groupBy: scope.groupBy ?? null,
      groups,
      standards: snapshot.standards.map((standard) => this.standardResult(standard, dataset)),
      reboundHistograms: dataset.schedule.map((interval) => reboundHistogram(dataset, interval.key)),
    };
    return { results, operatorIds };
  }

  /** A standard whose interval is not in the schedule (edited since) has no data rather than an error. */
  private isMeasurable(standard: StandardView, dataset: AuditDataset): boolean {
    return standard.intervalKey === null || dataset.schedule.some((interval) => interval.key === standard.intervalKey);
  }

  private standardResult(standard: StandardView, dataset: AuditDataset): StandardResult {
    if (!this.isMeasurable(standard, dataset)) return { standard, unit: STANDARD_METRIC_INFO[standard.metric].unit, observed: null, verdict: 'no-data' };
    return standardResult(standard, dataset);
  }

  private defaultInterval(dataset: AuditDataset, intervalKey?: string): string {
    if (intervalKey) {
      if (!dataset.schedule.some((interval) => interval.key === intervalKey)) {
        throw HttpError.badRequest('Unknown interval.', { intervalKey: 'Choose an interval of the audit’s schedule.' });
      }
      return intervalKey;
    }
    return dataset.schedule.find((interval) => interval.key === '6m')?.key ?? dataset.schedule[dataset.schedule.length - 1].key;
  }

  /** Operators against the practice rate; narrowed by phenotype only, since it always compares every operator. */
  async funnel(user: Express.User, auditId: number, scope: ResultScope & { measure: 'complication' | 'relapse'; intervalKey?: string }): Promise<FunnelResult> {
    const { snapshot, operatorIds } = await this.resolve(user, auditId, { ...scope, operatorId: undefined });
    const labelFor = await this.labeler(user, operatorIds);
    // An interval named in the query must exist even when the measure does not use it: a typo is a 400, not silently ignored.
    const checkedInterval = this.defaultInterval(snapshot.dataset, scope.intervalKey);
    const intervalKey = scope.measure === 'relapse' ? checkedInterval : undefined;
    return operatorFunnel(snapshot.dataset, scope.measure, { intervalKey, labelFor });
  }

  async trend(user: Express.User, auditId: number, scope: ResultScope & { intervalKey?: string }): Promise<TrendResult> {
    const { snapshot } = await this.resolve(user, auditId, scope);
    const trend = monthlyTrend(snapshot.dataset, this.defaultInterval(snapshot.dataset, scope.intervalKey));
    if (user.role !== 'governance') return trend;
    // Governance sees dates reduced to the month (DESIGN.md §7).
    return { ...trend, cusum: { ...trend.cusum, points: trend.cusum.points.map((point) => ({ ...point, surgeryDate: point.surgeryDate.slice(0, 7) })) } };
  }

  async survival(user: Express.User, auditId: number, scope: ResultScope): Promise<SurvivalResult> {
    const { snapshot } = await this.resolve(user, auditId, scope);
    return timeToRelapse(snapshot.dataset);
  }

  async calibration(user: Express.User, auditId: number, scope: ResultScope): Promise<CalibrationResult> {
    const { snapshot } = await this.resolve(user, auditId, scope);
    return calibrationAgreement(snapshot.calibrationPairs);
  }

  /** First cycle against a re-audit, standard by standard (matched by position in the standards list of the first). */
  async compare(user: Express.User, auditId: number, firstId: number, secondId: number): Promise<CycleComparison> {
    const [first, second] = await Promise.all([this.resolve(user, auditId, { cycleId: firstId }), this.resolve(user, auditId, { cycleId: secondId })]);
    const [firstCycle, secondCycle] = await Promise.all([this.cycles.findCycle(firstId), this.cycles.findCycle(secondId)]);
    // The re-audit is measured against each criterion as it stood in the first cycle.
    const standards = first.snapshot.standards.map((standard) =>
      this.isMeasurable(standard, first.snapshot.dataset) && this.isMeasurable(standard, second.snapshot.dataset)
        ? compareStandard(standard, first.snapshot.dataset, second.snapshot.dataset)
        : {
            criterion: standard.criterion,
            metric: standard.metric,
            unit: STANDARD_METRIC_INFO[standard.metric].unit,
            first: null,
            second: null,
            firstVerdict: 'no-data' as const,
            secondVerdict: 'no-data' as const,
            difference: null,
            ci95: null,
            test: null,
            p: null,
            isBeyondChance: null,
          },
    );
    return { first: { cycleId: firstId, number: firstCycle.number }, second: { cycleId: secondId, number: secondCycle.number }, standards };
  }
}
