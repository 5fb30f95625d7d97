import { type HttpEvent, HttpEventType } from '@angular/common/http';
import type { Observable } from 'rxjs';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import { Router } from '@angular/router';
import type { OrgChartColumnsDto, OrgChartReport } from '../../../../shared/api/org-chart';
import { type ImportFormat, type ImportIssue, type ImportReport, ROOM_LIMITS } from '../../../../shared/api/rooms';
import { toApiError } from '../../core/api-error';
import { strengthProblem } from '../editor/validation';
import { RoomsApi } from '../rooms-api';
import { FilePicker } from './file-picker';

/** What the dialog can read: the room file formats, and an org chart. */
export type ImportKind = ImportFormat | 'org-chart';

/** The starting strengths of an org-chart import (the server's defaults, stated in the dialog). */
export const ORG_CHART_STARTING_STRENGTHS = { reportsTo: 3, sameManager: 1 };

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
    MatSelectModule,
    MatSlideToggleModule,
    FilePicker,
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

  protected readonly format = signal<ImportKind>('csv');
  /** Org chart: the header, first rows, the column choices and the two strengths. */
  protected readonly preview = signal<OrgChartReport['preview'] | null>(null);
  protected readonly columns = signal<OrgChartColumnsDto>({ person: '', manager: '' });
  protected readonly reportsTo = signal<number | string>(ORG_CHART_STARTING_STRENGTHS.reportsTo);
  protected readonly sameManager = signal<number | string>(ORG_CHART_STARTING_STRENGTHS.sameManager);
  protected readonly strengthProblems = computed(() => ({
    reportsTo: strengthProblem(this.reportsTo()),
    sameManager: strengthProblem(this.sameManager()),
  }));
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
  protected readonly canCheck = computed(() => {
    const orgChartReady =
      this.format() !== 'org-chart' ||
      (!!this.columns().person && !!this.columns().manager && !this.strengthProblems().reportsTo && !this.strengthProblems().sameManager);
    return !!this.mainFile() && orgChartReady && (this.data.roomId !== null || this.name().trim().length > 0) && this.progress() === null;
  });
  protected readonly canCommit = computed(() => {
    const r = this.report();
    return !!r && r.dryRun && r.errors.length === 0 && this.progress() === null;
  });

  protected pick(kind: 'main' | 'people', picked: { file: File | null; input: HTMLInputElement }, picker: FilePicker): void {
    const { file } = picked;
    this.error.set(null);
    this.report.set(null);
    if (file && file.size > ROOM_LIMITS.maxUploadBytes) {
      this.error.set(`${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; files up to ${this.maxMb} MB can be imported.`);
      picker.reset();
      return;
    }
    if (kind === 'people') {
      this.peopleFile.set(file);
      return;
    }
    this.mainFile.set(file);
    if (this.format() === 'org-chart') {
      // Read the header: the server suggests the columns, the dialog shows the first rows.
      // Columns already chosen stay chosen: a fixed file usually has the same header.
      this.preview.set(null);
      if (file) this.run(true);
      return;
    }
    const lower = file?.name.toLowerCase() ?? '';
    if (lower.endsWith('.graphml') || lower.endsWith('.xml')) this.format.set('graphml');
    else if (lower.endsWith('.json')) this.format.set('json');
    else if (lower.endsWith('.csv') || lower.endsWith('.txt')) this.format.set('csv');
  }

  protected changeFormat(f: ImportKind): void {
    this.format.set(f);
    this.report.set(null);
    this.preview.set(null);
  }

  protected setColumn(field: keyof OrgChartColumnsDto, header: string): void {
    this.columns.update((c) => ({ ...c, [field]: header || undefined }));
    this.report.set(null);
  }

  protected setStrength(which: 'reportsTo' | 'sameManager', value: string): void {
    (which === 'reportsTo' ? this.reportsTo : this.sameManager).set(value);
    this.report.set(null);
  }

  protected where(i: ImportIssue): string {
    const parts = [i.file, i.line !== undefined ? `line ${i.line}` : null, i.field ? `“${i.field}”` : null, i.element];
    return parts.filter(Boolean).join(', ') || '—';
  }

  private orgChartForm(file: File): FormData {
    const form = new FormData();
    const c = this.columns();
    if (c.person && c.manager) {
      form.append('personColumn', c.person);
      form.append('managerColumn', c.manager);
      if (c.name) form.append('nameColumn', c.name);
      if (c.department) form.append('departmentColumn', c.department);
    }
    if (!this.strengthProblems().reportsTo) form.append('reportsTo', String(this.reportsTo()).replace(',', '.'));
    if (!this.strengthProblems().sameManager) form.append('sameManager', String(this.sameManager()).replace(',', '.'));
    if (this.data.roomId === null) form.append('roomName', this.name().trim() || file.name.replace(/\.[^.]+$/, ''));
    else if (this.data.version) form.append('version', String(this.data.version()));
    form.append('file', file, file.name);
    return form;
  }

  protected run(dryRun: boolean): void {
    const file = this.mainFile();
    if (!file) return;
    const kind = this.format();
    if (kind === 'org-chart') {
      this.send(this.api.importOrgChart(this.data.roomId, this.orgChartForm(file), dryRun));
      return;
    }
    const form = new FormData();
    form.append('format', kind);
    if (kind === 'csv') {
      form.append('directed', String(this.directed()));
      const people = this.peopleFile();
      if (people) form.append('people', people, people.name);
    }
    if (this.data.roomId === null) form.append('name', this.name().trim());
    else if (this.data.version) form.append('version', String(this.data.version()));
    form.append('file', file, file.name);
    this.send(this.api.import(this.data.roomId, form, dryRun));
  }

  private send(request: Observable<HttpEvent<ImportReport | OrgChartReport>>): void {
    this.error.set(null);
    this.progress.set(0);
    request.subscribe({
      next: (ev) => {
        if (ev.type === HttpEventType.UploadProgress && ev.total) this.progress.set(Math.round((100 * ev.loaded) / ev.total));
        if (ev.type === HttpEventType.Response && ev.body) {
          this.progress.set(null);
          this.report.set(ev.body);
          if ('preview' in ev.body) this.takePreview(ev.body);
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

  private takePreview(r: OrgChartReport): void {
    this.preview.set(r.preview);
    if (r.columns && !this.columns().person) this.columns.set({ ...r.columns });
  }

  private finish(r: ImportReport): void {
    if (this.data.roomId === null && r.roomId) void this.router.navigate(['/rooms', r.roomId]);
    this.ref.close(true);
  }
}
