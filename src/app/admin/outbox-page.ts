import { type AfterViewInit, ChangeDetectionStrategy, Component, DestroyRef, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatTableModule } from '@angular/material/table';
import { DomSanitizer, type SafeResourceUrl } from '@angular/platform-browser';
import { catchError, merge, of, startWith, Subject, switchMap } from 'rxjs';
import type { OutboxMessage, OutboxRow } from '../../../shared/api/accounts';
import { shownByInterceptor } from '../core/error-interceptor';
import { AdminApi } from './admin-api';
import { DateTimePipe } from '../core/date-format';

/**
 * Mail the local SMTP fake caught (development and test). The HTML part is shown in a
 * sandboxed iframe served with its own strict CSP: no scripts, nothing loaded from outside.
 */
@Component({
  selector: 'app-outbox-page',
  imports: [DateTimePipe, MatTableModule, MatPaginatorModule, MatButtonModule, MatButtonToggleModule, MatIconModule],
  templateUrl: './outbox-page.html',
  styleUrls: ['./admin-tables.scss', './outbox-page.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class OutboxPage implements AfterViewInit {
  private readonly api = inject(AdminApi);
  private readonly sanitizer = inject(DomSanitizer);
  private readonly destroyRef = inject(DestroyRef);
  private readonly paginator = viewChild.required(MatPaginator);
  private readonly reload = new Subject<void>();

  protected readonly columns = ['createdAt', 'to', 'subject'];
  protected readonly rows = signal<OutboxRow[]>([]);
  protected readonly total = signal(0);
  protected readonly loading = signal(true);
  protected readonly selected = signal<OutboxMessage | null>(null);
  protected readonly view = signal<'text' | 'html'>('html');
  protected readonly htmlUrl = signal<SafeResourceUrl | null>(null);

  ngAfterViewInit(): void {
    this.connectTable();
  }

  protected refresh(): void {
    this.reload.next();
  }

  protected open(row: OutboxRow): void {
    this.api.message(row.id).subscribe({ next: (message) => this.show(message), error: shownByInterceptor });
  }

  private show(message: OutboxMessage): void {
    this.selected.set(message);
    this.view.set(message.hasHtml ? 'html' : 'text');
    // Same-origin URL built from a numeric id only; the response itself forbids scripts.
    this.htmlUrl.set(
      message.hasHtml ? this.sanitizer.bypassSecurityTrustResourceUrl(`/api/admin/outbox/${Number(message.id)}/html`) : null,
    );
  }

  private connectTable(): void {
    const paginator = this.paginator();
    merge(paginator.page, this.reload)
      .pipe(
        startWith(null),
        switchMap(() => this.api.outbox({ page: paginator.pageIndex, pageSize: paginator.pageSize }).pipe(catchError(() => of(null)))),
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
