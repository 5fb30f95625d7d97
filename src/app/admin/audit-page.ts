import { type AfterViewInit, ChangeDetectionStrategy, Component, DestroyRef, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatTableModule } from '@angular/material/table';
import { catchError, debounceTime, distinctUntilChanged, merge, of, startWith, switchMap } from 'rxjs';
import type { AuditRow } from '../../../shared/api/accounts';
import { AdminApi } from './admin-api';
import { DateTimePipe } from '../core/date-format';
import { auditAction, auditChange, auditConcerns } from './audit-labels';

/** The audit log of account, room and workshop actions, newest first: who, what, when, from where. */
@Component({
  selector: 'app-audit-page',
  imports: [DateTimePipe, ReactiveFormsModule, MatTableModule, MatPaginatorModule, MatFormFieldModule, MatInputModule, MatIconModule],
  template: `
    <div class="rh-table-bar">
      <mat-form-field appearance="outline" class="rh-filter" subscriptSizing="dynamic">
        <mat-label>Filter by e-mail, title or action</mat-label>
        <mat-icon matPrefix>search</mat-icon>
        <input matInput [formControl]="filter" />
      </mat-form-field>
    </div>
    <div class="rh-table-wrap">
      <table mat-table [dataSource]="rows()" aria-label="Audit log">
        <ng-container matColumnDef="createdAt">
          <th mat-header-cell *matHeaderCellDef>When</th>
          <td mat-cell *matCellDef="let row">{{ row.createdAt | dateTime }}</td>
        </ng-container>
        <ng-container matColumnDef="actor">
          <th mat-header-cell *matHeaderCellDef>Who</th>
          <td mat-cell *matCellDef="let row">{{ row.actorEmail ?? 'not signed in' }}</td>
        </ng-container>
        <ng-container matColumnDef="action">
          <th mat-header-cell *matHeaderCellDef>What</th>
          <td mat-cell *matCellDef="let row">
            {{ describe(row) }}
            @if (change(row); as c) {
              <span class="rh-muted">({{ c }})</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="target">
          <th mat-header-cell *matHeaderCellDef>Concerns</th>
          <td mat-cell *matCellDef="let row">{{ concerns(row) }}</td>
        </ng-container>
        <ng-container matColumnDef="ip">
          <th mat-header-cell *matHeaderCellDef>From</th>
          <td mat-cell *matCellDef="let row" class="rh-mono">{{ row.ip }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
        <tr class="mat-mdc-row" *matNoDataRow>
          <td class="mat-mdc-cell rh-empty" [attr.colspan]="columns.length">{{ loading() ? 'Loading…' : 'No entries.' }}</td>
        </tr>
      </table>
      <mat-paginator [length]="total()" [pageSize]="50" [pageSizeOptions]="[25, 50, 100]" aria-label="Pages of the audit log" />
    </div>
  `,
  styleUrl: './admin-tables.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class AuditPage implements AfterViewInit {
  private readonly api = inject(AdminApi);
  private readonly destroyRef = inject(DestroyRef);
  private readonly paginator = viewChild.required(MatPaginator);
  protected readonly columns = ['createdAt', 'actor', 'action', 'target', 'ip'];
  protected readonly filter = new FormControl('', { nonNullable: true });
  protected readonly rows = signal<AuditRow[]>([]);
  protected readonly total = signal(0);
  protected readonly loading = signal(true);

  ngAfterViewInit(): void {
    this.connectTable();
  }

  protected readonly describe = auditAction;
  protected readonly change = auditChange;
  protected readonly concerns = auditConcerns;

  private connectTable(): void {
    const paginator = this.paginator();
    const filter = this.filter.valueChanges.pipe(debounceTime(250), distinctUntilChanged());
    filter.pipe(takeUntilDestroyed(this.destroyRef)).subscribe(() => (paginator.pageIndex = 0));
    merge(paginator.page, filter)
      .pipe(
        startWith(null),
        switchMap(() =>
          this.api
            .audit({ page: paginator.pageIndex, pageSize: paginator.pageSize, q: this.filter.value.trim() })
            .pipe(catchError(() => of(null))),
        ),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((page) => {
        this.loading.set(false);
        if (page) {
          this.rows.set(page.items);
          this.total.set(page.total);
        }
      });
  }
}
