import { EnvironmentInjector, Injectable, inject } from '@angular/core';

/** How long a notice stays up; long enough to read twice at the chair. */
const NOTICE_DURATION_MS = 10_000;

/** Announces a failed request in a snack bar. */
@Injectable({ providedIn: 'root' })
export class ErrorNotice {
  private readonly injector = inject(EnvironmentInjector);

  /**
   * Shows one sentence with a Dismiss action. The snack bar (and the overlay code under it)
   * is fetched on first use: it would otherwise add about a third to the first download,
   * which every visit pays and most never need.
   */
  show(message: string): void {
    void import('@angular/material/snack-bar').then(({ MatSnackBar }) => {
      this.injector.get(MatSnackBar).open(message, 'Dismiss', {
        duration: NOTICE_DURATION_MS,
        politeness: 'assertive',
      });
    });
  }
}
