import { DatePipe } from '@angular/common';
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
import { StatusChangeDialog, StatusChangeRequest } from '../status-change-dialog/status-change-dialog';
import { TeamApi } from '../team-api';

/** Columns of the team table, in order. */
const COLUMNS = ['name', 'email', 'role', 'status', 'lastSignIn', 'actions'] as const;

/** Team: who may sign in, with which role (admin only). */
@Component({
  selector: 'tm-team-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
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
    case 'lastSignIn':
      return member.lastSignInAt ? Date.parse(member.lastSignInAt) : 0;
    default:
      return '';
  }
}

/** Free-text filter over name, e-mail, role label and status word. */
function matchesFilter(member: UserView, filterText: string): boolean {
  const words = [member.displayName, member.email, ROLE_LABELS[member.role], member.active ? 'active' : 'inactive'];
  return words.some((word) => word.toLocaleLowerCase().includes(filterText));
}
