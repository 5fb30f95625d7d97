import { ChangeDetectionStrategy, Component, type ElementRef, input, output, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/** A labelled Material button that opens the file chooser, and the name of the file chosen. */
@Component({
  selector: 'app-file-picker',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <span class="rh-file-label" [id]="labelId">{{ label() }}</span>
    <input
      #input
      type="file"
      class="rh-file-input"
      tabindex="-1"
      aria-hidden="true"
      [attr.data-testid]="testId()"
      [accept]="accept()"
      (click)="clear($event)"
      (change)="choose($event)"
    />
    <button mat-stroked-button type="button" (click)="input.click()" [attr.aria-describedby]="labelId">
      <mat-icon>attach_file</mat-icon>{{ fileName() ? 'Choose another file' : 'Choose file' }}
    </button>
    <span class="rh-file-name" [class.rh-muted]="!fileName()">{{ fileName() ?? 'No file chosen' }}</span>
  `,
  styles: `
    :host {
      display: flex;
      align-items: center;
      gap: 12px;
      flex-wrap: wrap;
    }
    .rh-file-label {
      min-width: 160px;
      font-weight: 600;
    }
    .rh-file-input {
      position: absolute;
      width: 1px;
      height: 1px;
      opacity: 0;
      pointer-events: none;
    }
    .rh-file-name {
      overflow-wrap: anywhere;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FilePicker {
  private static next = 0;
  readonly label = input.required<string>();
  readonly accept = input('');
  readonly testId = input<string | null>(null);
  readonly picked = output<{ file: File | null; input: HTMLInputElement }>();
  protected readonly fileName = signal<string | null>(null);
  protected readonly labelId = `rh-file-label-${FilePicker.next++}`;
  private readonly inputRef = viewChild.required<ElementRef<HTMLInputElement>>('input');

  /** Choosing the same (fixed) file again must count as a change. */
  protected clear(e: Event): void {
    (e.target as HTMLInputElement).value = '';
  }

  protected choose(e: Event): void {
    const el = e.target as HTMLInputElement;
    const file = el.files?.[0] ?? null;
    this.fileName.set(file?.name ?? null);
    this.picked.emit({ file, input: el });
  }

  /** Forgets the file (the dialog refused it). */
  reset(): void {
    this.inputRef().nativeElement.value = '';
    this.fileName.set(null);
  }
}
