import { ChangeDetectionStrategy, Component, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/**
 * New recovery codes, shown this once (the server keeps only their hashes), with a way to
 * copy or print them. Emits `done` when the person says they are kept safe.
 */
@Component({
  selector: 'tm-recovery-codes-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule],
  templateUrl: './recovery-codes-panel.html',
  styleUrl: './recovery-codes-panel.scss',
})
export class RecoveryCodesPanel {
  /** The codes as issued (`ABCD-EFGH-JKMN-PQRS-TVWX-YZ01-2345`). */
  readonly codes = input.required<readonly string[]>();
  /** The person has put the codes away. */
  readonly done = output<void>();

  protected readonly copyOutcome = signal<string | null>(null);

  protected async copyCodes(): Promise<void> {
    try {
      await navigator.clipboard.writeText(this.codes().join('\n'));
      this.copyOutcome.set('Copied. Paste them into your password manager now.');
    } catch {
      // Clipboard access can be refused (permissions, insecure origin): say so rather than fail silently.
      this.copyOutcome.set('Copying was not allowed here. Select the codes and copy them, or print this page.');
    }
  }

  protected printCodes(): void {
    window.print();
  }

  protected finish(): void {
    this.done.emit();
  }
}
