import { ChangeDetectionStrategy, Component, effect, input, viewChild } from '@angular/core';
import { DecimalPipe } from '@angular/common';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import type { PlanPersonDto } from '../../../shared/api/plans';

/** Everyone's expected hops and minutes to hear under a plan: sortable, filterable, paged. */
@Component({
  selector: 'app-plan-people-table',
  imports: [DecimalPipe, MatTableModule, MatSortModule, MatPaginatorModule, MatFormFieldModule, MatInputModule, MatIconModule],
  template: `
    <mat-form-field appearance="outline" class="filter" subscriptSizing="dynamic">
      <mat-label>Filter people</mat-label>
      <mat-icon matPrefix>search</mat-icon>
      <input matInput (input)="filter($any($event.target).value)" placeholder="Name or group" />
    </mat-form-field>
    <table
      mat-table
      [dataSource]="source"
      matSort
      matSortActive="expectedHops"
      matSortDirection="asc"
      aria-label="Expected time to hear per person"
    >
      <ng-container matColumnDef="name">
        <th mat-header-cell *matHeaderCellDef mat-sort-header>Person</th>
        <td mat-cell *matCellDef="let p">{{ p.name }}</td>
      </ng-container>
      <ng-container matColumnDef="group">
        <th mat-header-cell *matHeaderCellDef mat-sort-header>Group</th>
        <td mat-cell *matCellDef="let p">{{ p.group ?? '—' }}</td>
      </ng-container>
      <ng-container matColumnDef="order">
        <th mat-header-cell *matHeaderCellDef mat-sort-header>Briefed</th>
        <td mat-cell *matCellDef="let p">
          @if (p.starter) {
            <span class="starter">starter {{ p.order }}</span>
          } @else {
            <span class="rh-muted">hears by word of mouth</span>
          }
        </td>
      </ng-container>
      <ng-container matColumnDef="expectedHops">
        <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before" class="num">Expected hops</th>
        <td mat-cell *matCellDef="let p" class="num">{{ p.expectedHops | number: '1.1-1' }}</td>
      </ng-container>
      <ng-container matColumnDef="expectedMinutes">
        <th mat-header-cell *matHeaderCellDef mat-sort-header arrowPosition="before" class="num">Minutes</th>
        <td mat-cell *matCellDef="let p" class="num">{{ p.expectedMinutes | number: '1.0-0' }}</td>
      </ng-container>
      <tr mat-header-row *matHeaderRowDef="columns"></tr>
      <tr mat-row *matRowDef="let row; columns: columns" [class.is-starter]="row.starter"></tr>
      <tr class="mat-mdc-row" *matNoDataRow>
        <td class="mat-mdc-cell empty" [attr.colspan]="columns.length">Nobody matches this filter.</td>
      </tr>
    </table>
    <mat-paginator [pageSizeOptions]="[10, 25, 100]" [pageSize]="10" aria-label="Pages of people" />
  `,
  styles: `
    :host {
      display: block;
      max-width: 100%;
      overflow-x: auto;
    }
    .filter {
      width: 100%;
      max-width: 320px;
      margin-bottom: 8px;
    }
    table {
      width: 100%;
      background: transparent;
    }
    .num {
      text-align: right;
    }
    .starter {
      color: var(--rh-clay-text);
      font-weight: 600;
    }
    .is-starter {
      background: #fbf0ea;
    }
    .empty {
      padding: 16px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PlanPeopleTable {
  readonly people = input.required<readonly PlanPersonDto[]>();
  protected readonly columns = ['name', 'group', 'order', 'expectedHops', 'expectedMinutes'];
  protected readonly source = new MatTableDataSource<PlanPersonDto>([]);
  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild.required(MatPaginator);

  constructor() {
    this.source.filterPredicate = (p, f) => p.name.toLowerCase().includes(f) || (p.group ?? '').toLowerCase().includes(f);
    this.source.sortingDataAccessor = (p, key) => {
      if (key === 'order') return p.order ?? Number.MAX_SAFE_INTEGER;
      if (key === 'group') return p.group ?? '';
      return (p as unknown as Record<string, string | number>)[key] ?? '';
    };
    effect(() => {
      this.source.sort = this.sort();
      this.source.paginator = this.paginator();
      this.source.data = [...this.people()];
    });
  }

  protected filter(value: string): void {
    this.source.filter = value.trim().toLowerCase();
  }
}
