import { HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import { Router } from '@angular/router';
import { type ImportFormat, type ImportIssue, type ImportReport, ROOM_LIMITS } from '../../../../shared/api/rooms';
import { toApiError } from '../../core/api-error';
import { RoomsApi } from '../rooms-api';

export interface ImportDialogData {
  /** null: the import creates a new room. */
  roomId: number | null;
  roomName?: string;
  /** The room's version at the moment of the commit. */
  version?: () => number;
  people?: number;
}

/** Choose files, check them (dry run), read counts and per-row problems, then import or fix and try again. */
@Component({
  selector: 'app-import-dialog',
  imports: [
    FormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatRadioModule,
    MatSlideToggleModule,
    MatTableModule,
  ],
  templateUrl: './import-dialog.html',
  styleUrl: './import-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportDialog {
  protected readonly data = inject<ImportDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<ImportDialog, boolean>);
  private readonly api = inject(RoomsApi);
  private readonly router = inject(Router);

  protected readonly format = signal<ImportFormat>('csv');
  protected readonly directed = signal(false);
  protected readonly name = signal('');
  protected readonly mainFile = signal<File | null>(null);
  protected readonly peopleFile = signal<File | null>(null);
  protected readonly report = signal<ImportReport | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly progress = signal<number | null>(null);
  protected readonly maxMb = ROOM_LIMITS.maxUploadBytes / 1024 / 1024;
  protected readonly issueColumns = ['severity', 'where', 'message'];

  protected readonly issues = computed<ImportIssue[]>(() => {
    const r = this.report();
    return r ? [...r.errors, ...r.warnings] : [];
  });
  protected readonly canCheck = computed(
    () => !!this.mainFile() && (this.data.roomId !== null || this.name().trim().length > 0) && this.progress() === null,
  );
  protected readonly canCommit = computed(() => {
    const r = this.report();
    return !!r && r.dryRun && r.errors.length === 0 && this.progress() === null;
  });

  protected pick(kind: 'main' | 'people', e: Event): void {
    const input = e.target as HTMLInputElement;
    const file = input.files?.[0] ?? null;
    this.error.set(null);
    this.report.set(null);
    if (file && file.size > ROOM_LIMITS.maxUploadBytes) {
      this.error.set(`${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; files up to ${this.maxMb} MB can be imported.`);
      input.value = '';
      return;
    }
    if (kind === 'main') {
      this.mainFile.set(file);
      const lower = file?.name.toLowerCase() ?? '';
      if (lower.endsWith('.graphml') || lower.endsWith('.xml')) this.format.set('graphml');
      else if (lower.endsWith('.json')) this.format.set('json');
      else if (lower.endsWith('.csv') || lower.endsWith('.txt')) this.format.set('csv');
    } else this.peopleFile.set(file);
  }

  /** Choosing the same (fixed) file again must count as a change. */
  protected clearInput(e: Event): void {
    (e.target as HTMLInputElement).value = '';
  }

  protected changeFormat(f: ImportFormat): void {
    this.format.set(f);
    this.report.set(null);
  }

  protected where(i: ImportIssue): string {
    const parts = [i.file, i.line !== undefined ? `line ${i.line}` : null, i.field ? `“${i.field}”` : null, i.element];
    return parts.filter(Boolean).join(', ') || '—';
  }

  protected run(dryRun: boolean): void {
    const file = this.mainFile();
    if (!file) return;
    const form = new FormData();
    form.append('format', this.format());
    if (this.format() === 'csv') {
      form.append('directed', String(this.directed()));
      const people = this.peopleFile();
      if (people) form.append('people', people, people.name);
    }
    if (this.data.roomId === null) form.append('name', this.name().trim());
    else if (this.data.version) form.append('version', String(this.data.version()));
    form.append('file', file, file.name);
    this.error.set(null);
    this.progress.set(0);
    this.api.import(this.data.roomId, form, dryRun).subscribe({
      next: (ev) => {
        if (ev.type === HttpEventType.UploadProgress && ev.total) this.progress.set(Math.round((100 * ev.loaded) / ev.total));
        if (ev.type === HttpEventType.Response && ev.body) {
          this.progress.set(null);
          this.report.set(ev.body);
          if (ev.body.committed) this.finish(ev.body);
        }
      },
      error: (err: unknown) => {
        this.progress.set(null);
        const e = toApiError(err);
        const report = (e.details as { report?: ImportReport } | undefined)?.report;
        if (report) this.report.set(report);
        const fields = e.details?.fields?.map((f) => `${f.field}: ${f.message}`).join('; ');
        this.error.set(fields ? `${e.message} (${fields})` : e.message);
      },
    });
  }

  private finish(r: ImportReport): void {
    if (this.data.roomId === null && r.roomId) void this.router.navigate(['/rooms', r.roomId]);
    this.ref.close(true);
  }
}
