import { Injectable, signal } from '@angular/core';
import type { IssuedLink } from '../../../shared/api/workshops';

/** Links handed from the workshop page to the sheet (just reissued ones); otherwise the sheet fetches them. */
@Injectable({ providedIn: 'root' })
export class LinkSheetStore {
  readonly links = signal<{ workshopId: number; title: string; links: IssuedLink[]; reissued: boolean } | null>(null);
}
