import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { FormGroup } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { SITE_LOCATIONS, SITE_LOCATION_LABELS, type SiteLocation } from '@tidemark/shared';
import { formRevision } from '../../../shared/forms/form-revision';
import { fieldMessage } from '../../../shared/forms/zod-validator';
import { ToothPicker } from '../../../shared/tooth-picker/tooth-picker';
import { addSite, removeSite, toggleTooth, type CaseEntryForm } from '../case-entry-form';

/** One chosen tooth with the locations measured on it. */
interface ChosenTooth {
  tooth: number;
  locations: Set<SiteLocation>;
  /** Messages the server or the schema left on this tooth's sites (tooth or location). */
  problems: string[];
}

/** New case, step three: which teeth, and which sites on each (mid-facial, papillae). */
@Component({
  selector: 'tm-sites-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatCheckboxModule, MatIconModule, ToothPicker],
  templateUrl: './sites-step.html',
  styleUrl: './sites-step.scss',
})
export class SitesStep {
  /** The whole New case form (sites are added and removed here). */
  readonly form = input.required<FormGroup<CaseEntryForm>>();

  private readonly revision = formRevision(this.form);
  protected readonly locations = SITE_LOCATIONS;
  protected readonly locationLabels = SITE_LOCATION_LABELS;

  protected readonly chosen = computed<ChosenTooth[]>(() => {
    this.revision();
    const byTooth = new Map<number, ChosenTooth>();
    for (const site of this.form().controls.sites.controls) {
      const { tooth, location } = site.controls;
      let entry = byTooth.get(tooth.value);
      if (!entry) {
        entry = { tooth: tooth.value, locations: new Set<SiteLocation>(), problems: [] };
        byTooth.set(tooth.value, entry);
      }
      entry.locations.add(location.value);
      for (const message of [fieldMessage(tooth), fieldMessage(location)]) {
        if (message) {
          entry.problems.push(message);
        }
      }
    }
    return [...byTooth.values()];
  });

  protected readonly selectedTeeth = computed(() => this.chosen().map((entry) => entry.tooth));
  protected readonly siteCount = computed(() => {
    this.revision();
    return this.form().controls.sites.length;
  });

  /** A problem with the list as a whole (none chosen, or a duplicate the server refused). */
  protected readonly listProblem = computed(() => {
    this.revision();
    const sites = this.form().controls.sites;
    return sites.touched || sites.hasError('server') ? fieldMessage(sites) : null;
  });

  protected toggleTooth(tooth: number): void {
    const form = this.form();
    toggleTooth(form, tooth);
    form.controls.sites.markAsTouched();
  }

  protected setLocation(tooth: number, location: SiteLocation, isMeasured: boolean): void {
    if (isMeasured) {
      addSite(this.form(), tooth, location);
    } else {
      removeSite(this.form(), tooth, location);
    }
  }

  protected isOnlyLocation(entry: ChosenTooth, location: SiteLocation): boolean {
    return entry.locations.size === 1 && entry.locations.has(location);
  }
}
