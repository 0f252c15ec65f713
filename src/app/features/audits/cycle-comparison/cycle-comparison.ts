import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import type { AuditView, CycleComparison as Comparison, StandardComparison } from '@tidemark/shared';
import { Subject, catchError, map, merge, of, switchMap } from 'rxjs';
import { VerdictBadge } from '../badges/verdict-badge';
import { AuditsApi } from '../audits-api';
import { failureSentence } from '../failure-sentence';
import { formatChange, formatInterval, formatMeasure, formatP } from '../standard-wording';

const TEST_NAMES: Readonly<Record<NonNullable<StandardComparison['test']>, string>> = {
  'welch-t': 'Welch t-test',
  'rank-sum': 'Mann–Whitney U',
  'fisher-exact': 'Fisher exact test',
};

/** One standard of the comparison, in words. */
interface ComparisonRow {
  readonly criterion: string;
  readonly first: string;
  readonly firstVerdict: StandardComparison['firstVerdict'];
  readonly second: string;
  readonly secondVerdict: StandardComparison['secondVerdict'];
  readonly change: string;
  readonly changeInterval: string;
  readonly test: string;
  readonly p: string;
  readonly chance: { readonly icon: string; readonly word: string; readonly isBeyond: boolean };
}

type ComparisonLoad = { readonly comparison: Comparison } | { readonly failure: string } | null;

/** Closes the loop: a re-audit cycle against the first, standard by standard, with the change and its test. */
@Component({
  selector: 'tm-cycle-comparison',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatFormFieldModule, MatIconModule, MatProgressBarModule, MatSelectModule, MatTableModule, ReactiveFormsModule, VerdictBadge],
  templateUrl: './cycle-comparison.html',
  styleUrl: './cycle-comparison.scss',
})
export class CycleComparison {
  private readonly api = inject(AuditsApi);

  /** The audit whose cycles are compared. */
  readonly audit = input.required<AuditView>();

  protected readonly first = new FormControl<number | null>(null);
  protected readonly second = new FormControl<number | null>(null);
  protected readonly columns = ['criterion', 'first', 'second', 'change'];
  protected readonly cycles = computed(() => [...this.audit().cycles].sort((a, b) => a.number - b.number));
  protected readonly isLoading = signal(false);
  protected readonly load = signal<ComparisonLoad>(null);
  private readonly picks = new Subject<void>();

  protected readonly rows = computed<ComparisonRow[]>(() => {
    const load = this.load();
    return load && 'comparison' in load ? load.comparison.standards.map(describeRow) : [];
  });
  protected readonly failure = computed(() => {
    const load = this.load();
    return load && 'failure' in load ? load.failure : null;
  });
  protected readonly heading = computed(() => {
    const load = this.load();
    return load && 'comparison' in load ? `Cycle ${load.comparison.second.number} against cycle ${load.comparison.first.number}` : null;
  });

  constructor() {
    // A new set of cycles (e.g. after one was added) starts from the first against the latest.
    effect(() => {
      const cycles = this.cycles();
      untracked(() => {
        this.first.setValue(cycles[0]?.id ?? null, { emitEvent: false });
        this.second.setValue(cycles.length > 1 ? (cycles.at(-1)?.id ?? null) : null, { emitEvent: false });
        this.picks.next();
      });
    });
    merge(this.picks, this.first.valueChanges, this.second.valueChanges)
      .pipe(
        map(() => [this.first.value, this.second.value] as const),
        switchMap(([first, second]) => {
          if (first === null || second === null || first === second) return of<ComparisonLoad>(null);
          this.isLoading.set(true);
          return this.api.compare(this.audit().id, first, second).pipe(
            map((comparison): ComparisonLoad => ({ comparison })),
            catchError((error: unknown) => of<ComparisonLoad>({ failure: failureSentence(error) })),
          );
        }),
        takeUntilDestroyed(),
      )
      .subscribe((load) => {
        this.isLoading.set(false);
        this.load.set(load);
      });
  }
}

function describeRow(row: StandardComparison): ComparisonRow {
  const observed = (value: StandardComparison['first']): string =>
    value ? `${formatMeasure(value.value, row.unit)} [${formatInterval(value.ci95, row.unit)}]` : 'No data';
  const change = row.difference === null ? null : formatChange(row.difference, row.ci95, row.unit);
  return {
    criterion: row.criterion,
    first: observed(row.first),
    firstVerdict: row.firstVerdict,
    second: observed(row.second),
    secondVerdict: row.secondVerdict,
    change: change?.change ?? '—',
    changeInterval: change?.interval ?? '',
    test: row.test ? TEST_NAMES[row.test] : 'Not tested',
    p: row.p === null ? '' : formatP(row.p),
    chance:
      row.isBeyondChance === null
        ? { icon: 'remove', word: 'Not tested', isBeyond: false }
        : row.isBeyondChance
          ? { icon: 'change_circle', word: 'Beyond chance', isBeyond: true }
          : { icon: 'drag_handle', word: 'Within chance', isBeyond: false },
  };
}
