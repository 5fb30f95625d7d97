import { Injectable, signal } from '@angular/core';
import type { IssuedLink } from '../../../shared/api/workshops';

/** Freshly issued links live only in memory, for the printable sheet; a reload means a new sheet. */
@Injectable({ providedIn: 'root' })
export class LinkSheetStore {
  readonly links = signal<{ workshopId: number; title: string; links: IssuedLink[] } | null>(null);
}
