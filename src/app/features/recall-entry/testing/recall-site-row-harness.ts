import { BaseHarnessFilters, ComponentHarness, HarnessPredicate } from '@angular/cdk/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';

/** The fields of a recall row, as the harness names them. */
export type RecallField = 'refGm' | 'probingDepth' | 'ktWidth' | 'papillaScore';

const FIELD_LABELS: Readonly<Record<RecallField, string>> = {
  refGm: 'REF→GM',
  probingDepth: 'Probing',
  ktWidth: 'KT width',
  papillaScore: 'Papilla 0–4',
};

/** Filters for a row: its site name as shown, e.g. "11 · Mid-facial". */
export interface RecallSiteRowFilters extends BaseHarnessFilters {
  site?: string;
}

/** Test harness for one row of the recall grid (`tm-recall-site-row`). */
export class RecallSiteRowHarness extends ComponentHarness {
  static hostSelector = 'tm-recall-site-row';

  static with(filters: RecallSiteRowFilters = {}): HarnessPredicate<RecallSiteRowHarness> {
    return new HarnessPredicate(RecallSiteRowHarness, filters).addOption('site', filters.site, async (harness, site) =>
      HarnessPredicate.stringMatches(await harness.getSiteName(), site),
    );
  }

  /** "11 · Mid-facial". */
  async getSiteName(): Promise<string> {
    const label = await (await this.locatorFor('.row')()).getAttribute('aria-label');
    return (label ?? '').replace(/^Tooth /, '');
  }

  private input(field: RecallField): Promise<MatInputHarness> {
    return this.locatorFor(MatInputHarness.with({ selector: `[data-field="${field}"]` }))();
  }

  /** Types a value the way a person would (clearing the field first). */
  async setValue(field: RecallField, value: string): Promise<void> {
    await (await this.input(field)).setValue(value);
  }

  async getValue(field: RecallField): Promise<string> {
    return (await this.input(field)).getValue();
  }

  async hasField(field: RecallField): Promise<boolean> {
    return (await this.locatorForOptional(`[data-field="${field}"]`)()) !== null;
  }

  /** Messages shown under a field. */
  async getErrors(field: RecallField): Promise<string[]> {
    const formField = await this.locatorFor(MatFormFieldHarness.with({ floatingLabelText: FIELD_LABELS[field] }))();
    return formField.getTextErrors();
  }

  async toggleBleeding(): Promise<void> {
    await (await this.locatorFor(MatCheckboxHarness)()).toggle();
  }

  /** The live outcome as read on screen: rebound, retained gain, stability word (or what is missing). */
  async getOutcomeText(): Promise<string> {
    return (await (await this.locatorFor('.outcome')()).text()).replace(/\s+/g, ' ').trim();
  }

  /** The large-change warning beside REF→GM, or null. */
  async getWarning(): Promise<string | null> {
    const warning = await this.locatorForOptional('.change-warning')();
    return warning ? (await warning.text()).replace(/\s+/g, ' ').trim() : null;
  }
}
