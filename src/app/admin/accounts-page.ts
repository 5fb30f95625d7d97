import { type AfterViewInit, ChangeDetectionStrategy, Component, DestroyRef, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import {
  catchError,
  concatMap,
  debounceTime,
  distinctUntilChanged,
  filter,
  finalize,
  merge,
  type Observable,
  of,
  startWith,
  Subject,
  switchMap,
  tap,
} from 'rxjs';
import type { AccountRole, AccountRow, AccountSortKey } from '../../../shared/api/accounts';
import { Auth } from '../core/auth';
import { AdminApi } from './admin-api';
import { ConfirmDialog, type ConfirmData } from '../core/confirm-dialog';
import { InviteDialog } from './invite-dialog';
import { DateTimePipe } from '../core/date-format';

/** The accounts table: server-side sort, filter and paging; actions per account in a menu. */
@Component({
  selector: 'app-accounts-page',
  imports: [
    DateTimePipe,
    ReactiveFormsModule,
    MatTableModule,
    MatSortModule,
    MatPaginatorModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
  ],
  templateUrl: './accounts-page.html',
  styleUrl: './admin-tables.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class AccountsPage implements AfterViewInit {
  private readonly api = inject(AdminApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly auth = inject(Auth);

  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);
  private readonly reload = new Subject<void>();

  protected readonly columns = ['name', 'email', 'role', 'status', 'lastSignInAt', 'actions'];
  protected readonly filter = new FormControl('', { nonNullable: true });
  protected readonly rows = signal<AccountRow[]>([]);
  protected readonly total = signal(0);
  protected readonly loading = signal(true);
  protected readonly failed = signal(false);

  ngAfterViewInit(): void {
    this.connectTable();
  }

  private connectTable(): void {
    const sort = this.sort();
    const paginator = this.paginator();
    const filter = this.filter.valueChanges.pipe(debounceTime(250), distinctUntilChanged());
    // A new sort or filter starts again at the first page.
    merge(sort.sortChange, filter)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => (paginator.pageIndex = 0));
    merge(sort.sortChange, paginator.page, filter, this.reload)
      .pipe(
        startWith(null),
        tap(() => this.loading.set(true)),
        switchMap(() =>
          this.api
            .accounts({
              page: paginator.pageIndex,
              pageSize: paginator.pageSize,
              sort: (sort.active || 'createdAt') as AccountSortKey,
              direction: sort.direction || 'desc',
              q: this.filter.value.trim(),
            })
            .pipe(catchError(() => of(null))),
        ),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((page) => {
        this.loading.set(false);
        this.failed.set(page === null);
        if (page) {
          this.rows.set(page.items);
          this.total.set(page.total);
        }
      });
  }

  protected statusLabel(row: AccountRow): string {
    if (row.status !== 'invited') return row.status === 'active' ? 'Active' : 'Deactivated';
    return (
      {
        pending: 'Invited',
        expired: 'Invitation expired',
        revoked: 'Invitation revoked',
        accepted: 'Invited',
        none: 'Invited',
      } as const
    )[row.invitation];
  }

  protected openInvite(): void {
    this.dialog
      .open(InviteDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((email?: string) => {
        if (!email) return;
        this.snackBar.open(`Invitation sent to ${email}.`, 'OK', { duration: 5000 });
        this.reload.next();
      });
  }

  /** Asks first; once confirmed, runs the action, says `done` and reloads the table (also after a failure). */
  private confirmThen(data: ConfirmData, action: () => Observable<unknown>, done: string): void {
    this.dialog
      .open(ConfirmDialog, { data })
      .afterClosed()
      .pipe(
        filter((v) => !!v),
        concatMap(() =>
          action().pipe(
            tap(() => this.snackBar.open(done, 'OK', { duration: 5000 })),
            finalize(() => this.reload.next()),
          ),
        ),
      )
      // A failure has been shown by the error interceptor.
      .subscribe({ error: () => undefined });
  }

  protected resend(row: AccountRow): void {
    this.confirmThen(
      {
        title: 'Send a new invitation?',
        message: `${row.email} gets a fresh link; the link sent before stops working.`,
        confirm: 'Send new link',
      },
      () => this.api.resendInvitation(row.id),
      `A new invitation is on its way to ${row.email}.`,
    );
  }

  protected revoke(row: AccountRow): void {
    this.confirmThen(
      {
        title: 'Revoke the invitation?',
        message: `The link sent to ${row.email} stops working. You can send a new one later.`,
        confirm: 'Revoke',
        danger: true,
      },
      () => this.api.revokeInvitation(row.id),
      `The invitation for ${row.email} is revoked.`,
    );
  }

  protected setActive(row: AccountRow, active: boolean): void {
    this.confirmThen(
      active
        ? { title: `Reactivate ${row.name || row.email}?`, message: 'They can sign in again with their password.', confirm: 'Reactivate' }
        : {
            title: `Deactivate ${row.name || row.email}?`,
            message:
              'They are signed out everywhere at once and cannot sign in until an admin reactivates the account. Their rooms are kept.',
            confirm: 'Deactivate',
            danger: true,
          },
      () => this.api.setActive(row.id, active),
      active ? `${row.email} is active again.` : `${row.email} is deactivated and signed out.`,
    );
  }

  protected changeRole(row: AccountRow, role: AccountRole): void {
    const label = role === 'admin' ? 'an admin' : 'a facilitator';
    this.confirmThen(
      {
        title: `Make ${row.name || row.email} ${label}?`,
        message:
          role === 'admin'
            ? 'Admins manage every account, see the audit log and the captured outbox.'
            : 'They keep their rooms but lose the admin console.',
        confirm: 'Change role',
      },
      () => this.api.changeRole(row.id, role),
      `${row.email} is now ${label}.`,
    );
  }

  protected sendReset(row: AccountRow): void {
    this.confirmThen(
      {
        title: 'Send a password-reset link?',
        message: `${row.email} gets a link to choose a new password (it works once, for one hour).`,
        confirm: 'Send link',
      },
      () => this.api.sendResetLink(row.id),
      `A reset link is on its way to ${row.email}.`,
    );
  }
}
