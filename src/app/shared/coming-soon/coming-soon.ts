import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Route data a `ComingSoon` page is configured with. */
export interface ComingSoonData {
  /** Page name, shown as the heading. */
  readonly heading: string;
  /** One sentence on what the page will be for. */
  readonly purpose: string;
  /** Which release brings it, e.g. "Arrives with the audits release." */
  readonly release: string;
}

/**
 * Honest stand-in for a page that is not built yet: its name, what it will be for,
 * and which release brings it. Inputs are bound from route data.
 */
@Component({
  selector: 'tm-coming-soon',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  templateUrl: './coming-soon.html',
  styleUrl: './coming-soon.scss',
})
export class ComingSoon {
  /** Page name. */
  readonly heading = input.required<string>();
  /** What the page will be for. */
  readonly purpose = input.required<string>();
  /** Which release brings it. */
  readonly release = input.required<string>();
}
