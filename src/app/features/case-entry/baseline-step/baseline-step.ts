import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormArray, FormGroup } from '@angular/forms';
import { formRevision } from '../../../shared/forms/form-revision';
import type { SiteForm } from '../case-entry-form';
import { SiteBaselineCard } from '../site-baseline-card/site-baseline-card';

/** New case, step four: the starting readings of every chosen site, with the planning check. */
@Component({
  selector: 'tm-baseline-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SiteBaselineCard],
  template: `
    <div class="step">
      <p class="help">
        REF→GM is the distance from the fixed reference point to the mid-facial gingival margin; it grows when tissue is
        removed. Enter millimetres to the nearest 0.5 mm (0–20 mm); focus or point at a field to see how it is measured.
      </p>
      @for (site of siteGroups(); track site) {
        <tm-site-baseline-card [group]="site" [isOperated]="isOperated()" />
      } @empty {
        <p class="help">Choose the teeth in the previous step first.</p>
      }
    </div>
  `,
  styles: `
    .step {
      display: flex;
      flex-direction: column;
      gap: 16px;
      padding-top: 8px;
    }
    .help {
      margin: 0;
      max-width: 75ch;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class BaselineStep {
  /** The sites of the New case form. */
  readonly sites = input.required<FormArray<FormGroup<SiteForm>>>();
  /** Whether post-op readings are asked for. */
  readonly isOperated = input(false);

  private readonly revision = formRevision(this.sites);
  protected readonly siteGroups = computed(() => {
    this.revision();
    return [...this.sites().controls];
  });
}
