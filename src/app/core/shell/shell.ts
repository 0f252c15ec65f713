import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { ROLE_LABELS } from '@tidemark/shared';
import { map } from 'rxjs';
import { Wordmark } from '../../shared/wordmark/wordmark';
import { ACCOUNT_SECURITY_PATH } from '../auth/account-security-path';
import { AuthSession } from '../auth/auth-session';
import { SIGN_IN_PATH } from '../auth/sign-in-path';
import { ColorScheme } from '../theme/color-scheme';
import { navigationFor } from './navigation';

/** Below this width (tablets either way up, phones) the menu slides over the page, leaving the width to tables. */
export const NARROW_LAYOUT_QUERY = '(max-width: 1199.98px)';

/** The signed-in frame: toolbar, the role's menu and the routed page. */
@Component({
  selector: 'tm-shell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatMenuModule,
    MatSidenavModule,
    MatToolbarModule,
    MatTooltipModule,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
    Wordmark,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
})
export class Shell {
  private readonly session = inject(AuthSession);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly colorScheme = inject(ColorScheme);

  protected readonly user = this.session.user;
  protected readonly accountSecurityPath = ACCOUNT_SECURITY_PATH;
  protected readonly roleLabel = computed(() => {
    const user = this.user();
    return user ? ROLE_LABELS[user.role] : '';
  });
  protected readonly navigation = computed(() => {
    const user = this.user();
    return user ? navigationFor(user.role) : [];
  });

  protected readonly isNarrow = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW_LAYOUT_QUERY)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  /** Whether the slide-over menu is open (narrow layout only; the wide layout always shows it). */
  protected readonly isMenuOpen = signal(false);
  protected readonly isSigningOut = signal(false);

  protected toggleMenu(): void {
    this.isMenuOpen.update((open) => !open);
  }

  protected closeMenuAfterNavigation(): void {
    if (this.isNarrow()) {
      this.isMenuOpen.set(false);
    }
  }

  protected signOut(): void {
    this.isSigningOut.set(true);
    this.session
      .signOut()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => void this.router.navigateByUrl(SIGN_IN_PATH));
  }
}
