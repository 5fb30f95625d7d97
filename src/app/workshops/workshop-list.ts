import { ChangeDetectionStrategy, Component, inject, type OnInit, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import type { RoomListItem } from '../../../shared/api/rooms';
import { NOMINATION_LIMIT_MAX, STATUS_LABELS, type WorkshopSummary } from '../../../shared/api/workshops';
import { catchError, concatMap, from, of, tap } from 'rxjs';
import { toApiError } from '../core/api-error';
import { shownByInterceptor } from '../core/error-interceptor';
import { WorkshopsApi } from './workshops-api';
import { DayPipe } from '../core/date-format';

/** The facilitator's workshops, and a form to start a new one. */
@Component({
  selector: 'app-workshop-list',
  imports: [DayPipe, ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatIconModule],
  templateUrl: './workshop-list.html',
  styleUrl: './workshops.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class WorkshopList implements OnInit {
  private readonly api = inject(WorkshopsApi);
  private readonly router = inject(Router);
  protected readonly labels = STATUS_LABELS;
  protected readonly max = NOMINATION_LIMIT_MAX;
  protected readonly workshops = signal<WorkshopSummary[]>([]);
  protected readonly rooms = signal<RoomListItem[]>([]);
  protected readonly error = signal<string | null>(null);
  protected readonly form = new FormGroup({
    title: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(160)] }),
    sessionDate: new FormControl(new Date().toISOString().slice(0, 10), { nonNullable: true, validators: [Validators.required] }),
    roomId: new FormControl<number | null>(null),
    nominationLimit: new FormControl(5, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(1), Validators.max(NOMINATION_LIMIT_MAX)],
    }),
  });

  ngOnInit(): void {
    this.loadLists();
  }

  /** The workshops, then the rooms a new workshop can use (none when they cannot be read). */
  private loadLists(): void {
    this.api
      .list()
      .pipe(
        tap((list) => this.workshops.set(list)),
        concatMap(() => this.api.rooms().pipe(catchError(() => of({ items: [] as RoomListItem[] })))),
      )
      .subscribe({ next: (page) => this.rooms.set(page.items.filter((r) => r.access !== 'viewer')), error: shownByInterceptor });
  }

  protected create(): void {
    if (this.form.invalid) return;
    this.error.set(null);
    this.api
      .create(this.form.getRawValue())
      .pipe(concatMap((w) => from(this.router.navigate(['/workshops', w.id]))))
      .subscribe({ error: (err: unknown) => this.error.set(toApiError(err).message) });
  }
}
