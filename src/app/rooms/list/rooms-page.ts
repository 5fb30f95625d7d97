import { type AfterViewInit, ChangeDetectionStrategy, Component, DestroyRef, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import { catchError, concatMap, debounceTime, distinctUntilChanged, filter, merge, of, startWith, Subject, switchMap } from 'rxjs';
import { shownByInterceptor } from '../../core/error-interceptor';
import type { SortDirection } from '../../../../shared/api/lists';
import type { RoomListItem, RoomListQuery, RoomSort } from '../../../../shared/api/rooms';
import { ConfirmDialog, type ConfirmData } from '../dialogs/confirm-dialog';
import { CreateRoomDialog } from '../dialogs/create-room-dialog';
import { ImportDialog, type ImportDialogData } from '../dialogs/import-dialog';
import { RoomsApi } from '../rooms-api';
import { DateTimePipe } from '../../core/date-format';

type Scope = NonNullable<RoomListQuery['scope']>;

/** The facilitator's rooms (and rooms shared with them), paged and sorted on the server. */
@Component({
  selector: 'app-rooms-page',
  imports: [
    DateTimePipe,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatSortModule,
    MatTableModule,
    MatTooltipModule,
  ],
  templateUrl: './rooms-page.html',
  styleUrl: './rooms-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class RoomsPage implements AfterViewInit {
  private readonly api = inject(RoomsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  protected readonly columns = ['name', 'people', 'ties', 'updatedAt', 'actions'];
  protected readonly rows = signal<RoomListItem[]>([]);
  protected readonly total = signal(0);
  protected readonly loading = signal(true);
  protected readonly failed = signal(false);
  protected readonly scope = signal<Scope>('all');
  protected readonly query = signal('');
  private readonly search$ = new Subject<string>();
  private readonly refresh$ = new Subject<void>();

  ngAfterViewInit(): void {
    this.startPaging();
  }

  private startPaging(): void {
    const sort = this.sort();
    const paginator = this.paginator();
    const search = this.search$.pipe(debounceTime(250), distinctUntilChanged());
    merge(sort.sortChange, search, this.refresh$)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => paginator.firstPage());
    merge(sort.sortChange, paginator.page, search, this.refresh$)
      .pipe(
        startWith(null),
        switchMap(() => {
          this.loading.set(true);
          return this.api
            .list({
              q: this.query().trim() || undefined,
              sort: (sort.active as RoomSort) || 'updatedAt',
              direction: (sort.direction || 'desc') as SortDirection,
              page: paginator.pageIndex,
              pageSize: paginator.pageSize,
              scope: this.scope(),
            })
            .pipe(catchError(() => of(null)));
        }),
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

  protected search(q: string): void {
    this.query.set(q);
    this.search$.next(q);
  }

  protected setScope(s: Scope): void {
    this.scope.set(s);
    this.refresh$.next();
  }

  protected create(): void {
    this.dialog
      .open(CreateRoomDialog, { width: '720px', maxWidth: '96vw' })
      .afterClosed()
      .subscribe((room) => {
        if (room) void this.router.navigate(['/rooms', room.id]);
      });
  }

  protected importRoom(): void {
    const data: ImportDialogData = { roomId: null };
    this.dialog.open(ImportDialog, { data, width: '860px', maxWidth: '96vw' });
  }

  protected duplicate(r: RoomListItem): void {
    this.api.duplicate(r.id, `${r.name} (copy)`.slice(0, 120)).subscribe({
      next: (copy) => {
        this.snack
          .open(`Made "${copy.name}".`, 'Open', { duration: 5000 })
          .onAction()
          .subscribe(() => void this.router.navigate(['/rooms', copy.id]));
        this.refresh$.next();
      },
      error: shownByInterceptor,
    });
  }

  protected remove(r: RoomListItem): void {
    const data: ConfirmData = {
      title: `Delete ${r.name}?`,
      message: `Everything in the room goes: its ${r.people} people, ${r.ties} ties, settings, plans and rehearsals, and the access of anyone it is shared with. This cannot be undone.`,
      confirm: 'Delete the room',
    };
    this.dialog
      .open(ConfirmDialog, { data, width: '480px' })
      .afterClosed()
      .pipe(
        filter((yes) => !!yes),
        concatMap(() => this.api.delete(r.id)),
      )
      .subscribe({
        next: () => {
          this.snack.open(`${r.name} and everything in it was deleted.`, 'OK', { duration: 4000 });
          this.refresh$.next();
        },
        error: shownByInterceptor,
      });
  }
}
