import { ChangeDetectionStrategy, Component, DestroyRef, effect, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { ROLES, ROLE_LABELS, type Role, type UserUpdateRequest, type UserView } from '@tidemark/shared';
import { filter } from 'rxjs';
import { AuthSession } from '../../../core/auth/auth-session';
import { AddMemberDialog } from '../add-member-dialog/add-member-dialog';
import { MemberStatus } from '../member-status/member-status';
import { MemberPasswordDialog } from '../member-password-dialog/member-password-dialog';
import { MemberProtection } from '../member-protection/member-protection';
import { RenameMemberDialog } from '../rename-member-dialog/rename-member-dialog';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/confirm-dialog/confirm-dialog';
import { StatusChangeDialog, StatusChangeRequest } from '../status-change-dialog/status-change-dialog';
import { TeamApi } from '../team-api';
import { LocalDatePipe } from '../../../shared/dates/local-date-pipe';

/** Columns of the team table, in order. */
const COLUMNS = ['name', 'email', 'role', 'status', 'protection', 'lastSignIn', 'actions'] as const;

/** Team: who may sign in, with which role (admin only). */
@Component({
  selector: 'tm-team-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    LocalDatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
    MemberProtection,
    MemberStatus,
  ],
  templateUrl: './team-page.html',
  styleUrl: './team-page.scss',
})
export class TeamPage {
  private readonly teamApi = inject(TeamApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly columns = COLUMNS;
  protected readonly roles = ROLES;
  protected readonly currentUserId = inject(AuthSession).user()?.id ?? null;

  protected readonly members = new MatTableDataSource<UserView>([]);
  protected readonly isLoading = signal(true);
  protected readonly hasLoadFailed = signal(false);
  protected readonly filterText = signal('');
  /** The member whose change is being saved, so their actions pause meanwhile. */
  protected readonly savingMemberId = signal<number | null>(null);

  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  constructor() {
    this.members.sortingDataAccessor = sortKey;
    this.members.filterPredicate = matchesFilter;
    effect(() => {
      this.members.sort = this.sort();
      this.members.paginator = this.paginator();
    });
    this.loadMembers();
  }

  protected loadMembers(): void {
    this.isLoading.set(true);
    this.hasLoadFailed.set(false);
    this.teamApi
      .list()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (members) => {
          this.members.data = members;
          this.isLoading.set(false);
        },
        // The error notice has already told the person why; offer a retry here.
        error: () => {
          this.isLoading.set(false);
          this.hasLoadFailed.set(true);
        },
      });
  }

  protected roleLabel(role: Role): string {
    return ROLE_LABELS[role];
  }

  protected applyFilter(text: string): void {
    this.filterText.set(text);
    this.members.filter = text.trim().toLocaleLowerCase();
    this.members.paginator?.firstPage();
  }

  protected openAddMember(): void {
    this.dialog
      .open<AddMemberDialog, void, UserView>(AddMemberDialog, { autoFocus: 'first-tabbable', maxWidth: '560px' })
      .afterClosed()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((member) => {
        if (member) {
          this.members.data = [...this.members.data, member];
          this.snackBar.open(`${member.displayName} was added as ${ROLE_LABELS[member.role]}.`, 'OK', { duration: 6000 });
        }
      });
  }

  protected changeRole(member: UserView, role: Role): void {
    if (member.role !== role) {
      this.saveChange(member, { role }, `${member.displayName} is now ${ROLE_LABELS[role]}.`);
    }
  }

  protected confirmStatusChange(member: UserView): void {
    const activate = !member.active;
    this.dialog
      .open<StatusChangeDialog, StatusChangeRequest, boolean>(StatusChangeDialog, { data: { member, activate } })
      .afterClosed()
      .pipe(
        filter((confirmed) => confirmed === true),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(() =>
        this.saveChange(
          member,
          { active: activate },
          `${member.displayName} was ${activate ? 'reactivated' : 'deactivated'}.`,
        ),
      );
  }

  protected openRename(member: UserView): void {
    this.dialog
      .open<RenameMemberDialog, UserView, UserView>(RenameMemberDialog, { data: member, autoFocus: 'first-tabbable', maxWidth: '560px' })
      .afterClosed()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((updated) => {
        if (updated) {
          this.replaceMember(updated);
          this.snackBar.open(`${member.displayName} is now shown as ${updated.displayName}.`, 'OK', { duration: 6000 });
        }
      });
  }

  protected openPasswordReset(member: UserView): void {
    this.dialog
      .open<MemberPasswordDialog, UserView, UserView>(MemberPasswordDialog, { data: member, autoFocus: 'first-tabbable', maxWidth: '560px' })
      .afterClosed()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((updated) => {
        if (updated) {
          this.replaceMember(updated);
          this.snackBar.open(`${updated.displayName} has a new password and was signed out everywhere.`, 'OK', { duration: 8000 });
        }
      });
  }

  /** A lost or replaced phone: after confirmation, removes the member's one-time and recovery codes and ends their sessions. */
  protected confirmSecondFactorReset(member: UserView): void {
    const data: ConfirmDialogData = {
      title: `Reset sign-in protection for ${member.displayName}?`,
      paragraphs: [
        `The one-time codes from ${member.displayName}'s authenticator app and their recovery codes stop working at once, and they are signed out on every device.`,
        'At their next sign-in they use their password, then set up one-time codes again with their app. Where their role requires codes, Tidemark asks for this before anything else.',
        'Do this when a phone is lost or replaced, or when you suspect someone else has their codes.',
      ],
      confirmLabel: 'Reset sign-in protection',
      icon: 'phonelink_erase',
    };
    this.afterConfirmation(data, () => this.resetSecondFactor(member));
  }

  /** A lost or shared device: after confirmation, signs the member out on every device; password and codes stay. */
  protected confirmEndSessions(member: UserView): void {
    const data: ConfirmDialogData = {
      title: `Sign ${member.displayName} out everywhere?`,
      paragraphs: [
        `Every open session of ${member.displayName} ends at once, on every computer, tablet and phone. Unsaved entries in those sessions are lost.`,
        'Their password and one-time codes stay as they are, so they can sign in again straight away. If someone else may know the password, set a new one as well.',
      ],
      confirmLabel: 'Sign out everywhere',
      icon: 'devices_off',
    };
    this.afterConfirmation(data, () => this.endSessions(member));
  }

  private endSessions(member: UserView): void {
    this.savingMemberId.set(member.id);
    this.teamApi
      .endSessions(member.id)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: ({ endedSessions }) => {
          this.savingMemberId.set(null);
          const ended = endedSessions === 0 ? 'had no open sessions' : `was signed out of ${endedSessions} ${endedSessions === 1 ? 'session' : 'sessions'}`;
          this.snackBar.open(`${member.displayName} ${ended}.`, 'OK', { duration: 8000 });
        },
        // The error notice says why.
        error: () => this.savingMemberId.set(null),
      });
  }

  private resetSecondFactor(member: UserView): void {
    this.savingMemberId.set(member.id);
    this.teamApi
      .resetSecondFactor(member.id)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => {
          this.replaceMember({ ...member, secondFactorEnabled: false });
          this.savingMemberId.set(null);
          this.snackBar.open(`${member.displayName}'s sign-in protection was reset. They set it up again at their next sign-in.`, 'OK', { duration: 8000 });
        },
        // The error notice says why; the row is unchanged.
        error: () => this.savingMemberId.set(null),
      });
  }

  /** Opens the confirmation and runs `action` only if the administrator confirms. */
  private afterConfirmation(data: ConfirmDialogData, action: () => void): void {
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, maxWidth: '560px' })
      .afterClosed()
      .pipe(
        filter((confirmed) => confirmed === true),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(action);
  }

  private replaceMember(updated: UserView): void {
    this.members.data = this.members.data.map((row) => (row.id === updated.id ? updated : row));
  }

  private saveChange(member: UserView, changes: UserUpdateRequest, confirmation: string): void {
    this.savingMemberId.set(member.id);
    this.teamApi
      .update(member.id, changes)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (updated) => {
          this.members.data = this.members.data.map((row) => (row.id === updated.id ? updated : row));
          this.savingMemberId.set(null);
          this.snackBar.open(confirmation, 'OK', { duration: 6000 });
        },
        // The error notice reports why (e.g. the last active administrator); the row is unchanged.
        error: () => this.savingMemberId.set(null),
      });
  }
}

/** Sort keys: names and roles as people read them, never-signed-in last when ascending. */
function sortKey(member: UserView, column: string): string | number {
  switch (column) {
    case 'name':
      return member.displayName.toLocaleLowerCase();
    case 'email':
      return member.email;
    case 'role':
      return ROLE_LABELS[member.role];
    case 'status':
      return member.active ? 0 : 1;
    case 'protection':
      return member.secondFactorEnabled ? 0 : 1;
    case 'lastSignIn':
      return member.lastSignInAt ? Date.parse(member.lastSignInAt) : 0;
    default:
      return '';
  }
}

/** Free-text filter over name, e-mail, role label and status word. */
function matchesFilter(member: UserView, filterText: string): boolean {
  const words = [member.displayName, member.email, ROLE_LABELS[member.role], member.active ? 'active' : 'inactive', member.secondFactorEnabled ? 'codes on' : 'password only'];
  return words.some((word) => word.toLocaleLowerCase().includes(filterText));
}
