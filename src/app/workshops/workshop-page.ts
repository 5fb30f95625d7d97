import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, type OnDestroy, type OnInit, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { REHEARSAL_LIMITS, type RehearsalSummary } from '../../../shared/api/plans';
import {
  BUILD_MODES,
  NOMINATION_LIMIT_MAX,
  STATUS_LABELS,
  WORKSHOP_STATUSES,
  type BuildMode,
  type BuildResult,
  type MissingAnswer,
  type SurveyProgress,
  type WorkshopDetail,
  type WorkshopStatus,
} from '../../../shared/api/workshops';
import { toApiError } from '../core/api-error';
import { LinkSheetStore } from './link-sheet-store';
import { WorkshopsApi } from './workshops-api';

/** One workshop: status, facilitators, participants and links, live survey count, room build, debrief. */
@Component({
  selector: 'app-workshop-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    DatePipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
  ],
  templateUrl: './workshop-page.html',
  styleUrl: './workshops.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export default class WorkshopPage implements OnInit, OnDestroy {
  readonly id = input.required<string>();
  private readonly api = inject(WorkshopsApi);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly sheet = inject(LinkSheetStore);

  protected readonly labels = STATUS_LABELS;
  protected readonly steps = WORKSHOP_STATUSES;
  protected readonly modes = BUILD_MODES;
  protected readonly sampleChoices = Array.from({ length: REHEARSAL_LIMITS.samples }, (_, i) => i);
  protected readonly w = signal<WorkshopDetail | null>(null);
  protected readonly progress = signal<SurveyProgress | null>(null);
  protected readonly mode = signal<BuildMode>('either');
  protected readonly missing = signal<MissingAnswer[]>([]);
  protected readonly built = signal<BuildResult | null>(null);
  protected readonly rehearsals = signal<RehearsalSummary[]>([]);
  protected readonly rosterIssues = signal<{ line: number; message: string }[]>([]);
  protected readonly personForm = new FormGroup({
    name: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(120)] }),
    email: new FormControl('', { nonNullable: true, validators: [Validators.email] }),
  });
  protected readonly facilitatorForm = new FormGroup({
    email: new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.email] }),
  });
  protected readonly releaseForm = new FormGroup({
    rehearsalId: new FormControl<number | null>(null, Validators.required),
    sampleRun: new FormControl(0, { nonNullable: true }),
    showStarters: new FormControl(false, { nonNullable: true }),
  });
  protected readonly settingsForm = new FormGroup({
    nominationLimit: new FormControl(5, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(1), Validators.max(NOMINATION_LIMIT_MAX)],
    }),
    linkDays: new FormControl(30, { nonNullable: true, validators: [Validators.required, Validators.min(1), Validators.max(365)] }),
  });
  protected readonly limitMax = NOMINATION_LIMIT_MAX;
  protected readonly doneRehearsals = computed(() => this.rehearsals().filter((r) => r.status === 'done'));
  protected readonly stepIndex = computed(() => WORKSHOP_STATUSES.indexOf(this.w()?.status ?? 'draft'));
  private timer: ReturnType<typeof setInterval> | undefined;
  private workshopId = 0;

  async ngOnInit(): Promise<void> {
    this.workshopId = Number(this.id());
    await this.reload();
    // Live survey count: a light poll every 3 s (the shell's busy bar ignores it).
    this.timer = setInterval(() => void this.poll(), 3000);
  }

  ngOnDestroy(): void {
    clearInterval(this.timer);
  }

  private async reload(): Promise<void> {
    const w = await this.api.detail(this.workshopId);
    this.w.set(w);
    this.releaseForm.controls.showStarters.setValue(w.showStarters);
    this.settingsForm.setValue({ nominationLimit: w.nominationLimit, linkDays: w.linkDays });
    await Promise.all([this.poll(), this.loadMissing(), this.loadRehearsals()]);
  }

  private async poll(): Promise<void> {
    const p = await this.api.progress(this.workshopId).catch(() => null);
    if (p) this.progress.set(p);
  }

  private async loadMissing(): Promise<void> {
    this.missing.set(await this.api.missing(this.workshopId, this.mode()));
  }

  private async loadRehearsals(): Promise<void> {
    const roomId = this.w()?.roomId;
    if (roomId) this.rehearsals.set(await this.api.rehearsals(roomId).catch(() => []));
  }

  protected async move(to: WorkshopStatus): Promise<void> {
    if (to === 'closed' && !confirm('Close this workshop? A closed workshop cannot be reopened or changed.')) return;
    this.w.set(await this.api.move(this.workshopId, to));
    await this.poll();
  }

  protected async addFacilitator(): Promise<void> {
    if (this.facilitatorForm.invalid) return;
    this.w.set(await this.api.addFacilitator(this.workshopId, this.facilitatorForm.getRawValue().email));
    this.facilitatorForm.reset();
  }

  protected async removeFacilitator(userId: number): Promise<void> {
    await this.api.removeFacilitator(this.workshopId, userId);
    await this.reload();
  }

  protected async addPerson(): Promise<void> {
    if (this.personForm.invalid) return;
    const { name, email } = this.personForm.getRawValue();
    const r = await this.api.addPeople(this.workshopId, [{ name, email: email || null }]);
    if (r.skipped.length) this.snack.open(`${r.skipped.join(', ')} is already on the list.`, 'OK', { duration: 5000 });
    this.personForm.reset();
    await this.reload();
  }

  protected async uploadRoster(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    if (!file) return;
    const csv = await file.text();
    input.value = '';
    try {
      const r = await this.api.roster(this.workshopId, csv);
      this.rosterIssues.set(r.issues);
      this.snack.open(`${r.added} added${r.skipped.length ? `, ${r.skipped.length} already listed` : ''}.`, 'OK', { duration: 5000 });
    } catch (err) {
      const e = toApiError(err);
      this.rosterIssues.set((e.details?.['issues'] as { line: number; message: string }[]) ?? []);
    }
    await this.reload();
  }

  protected async fromRoom(): Promise<void> {
    const r = await this.api.fromRoom(this.workshopId);
    this.snack.open(`${r.added} people taken from the room.`, 'OK', { duration: 4000 });
    await this.reload();
  }

  protected async removeParticipant(pid: number, name: string): Promise<void> {
    if (!confirm(`Remove ${name} and delete their answers?`)) return;
    await this.api.removeParticipant(this.workshopId, pid);
    await this.reload();
  }

  protected async resetClaim(pid: number): Promise<void> {
    await this.api.resetClaim(this.workshopId, pid);
    this.snack.open('The name can be picked again; the earlier link no longer works.', 'OK', { duration: 5000 });
    await this.reload();
  }

  protected async revoke(pid: number): Promise<void> {
    await this.api.revoke(this.workshopId, [pid]);
    await this.reload();
  }

  protected async emailLinks(): Promise<void> {
    const r = await this.api.email(this.workshopId);
    const parts = [`Sent to ${r.sent.length}.`];
    if (r.withoutEmail.length) parts.push(`${r.withoutEmail.length} without an address: print their links or use the QR code.`);
    if (r.failed.length) parts.push(`Could not send to ${r.failed.join(', ')}.`);
    this.snack.open(parts.join(' '), 'OK', { duration: 8000 });
    await this.reload();
  }

  protected async printSheet(): Promise<void> {
    const links = await this.api.sheet(this.workshopId);
    this.sheet.links.set({ workshopId: this.workshopId, title: this.w()!.title, links });
    await this.router.navigate(['/workshops', this.workshopId, 'sheet']);
  }

  protected async setMode(mode: BuildMode): Promise<void> {
    this.mode.set(mode);
    await this.loadMissing();
  }

  protected async build(): Promise<void> {
    const r = await this.api.build(this.workshopId, this.mode());
    this.built.set(r);
    this.missing.set(r.missing);
    await this.reload();
  }

  protected async release(): Promise<void> {
    const v = this.releaseForm.getRawValue();
    if (v.rehearsalId === null) return;
    this.w.set(
      await this.api.release(this.workshopId, { rehearsalId: v.rehearsalId, sampleRun: v.sampleRun, showStarters: v.showStarters }),
    );
    this.snack.open('Results released: participants now see their debrief on their own link.', 'OK', { duration: 6000 });
  }

  protected async toggleStarters(show: boolean): Promise<void> {
    this.w.set(await this.api.patch(this.workshopId, { showStarters: show }));
  }

  protected async saveSettings(): Promise<void> {
    if (this.settingsForm.invalid) return;
    this.w.set(await this.api.patch(this.workshopId, this.settingsForm.getRawValue()));
    this.snack.open('Settings saved.', 'OK', { duration: 3000 });
  }

  protected async deleteWorkshop(): Promise<void> {
    const w = this.w();
    if (!w || !confirm(`Delete “${w.title}” with its participants, links and every survey answer? The room stays.`)) return;
    await this.api.remove(this.workshopId);
    this.snack.open('The workshop and all its survey data are deleted.', 'OK', { duration: 5000 });
    await this.router.navigate(['/workshops']);
  }

  protected async refreshRehearsals(): Promise<void> {
    await this.loadRehearsals();
  }
}
