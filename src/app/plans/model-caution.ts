import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The model cautions of the product, shown next to every result. */
@Component({
  selector: 'app-model-caution',
  template: `
    <aside class="rh-caution" aria-label="How to read these numbers">
      <strong>A planning aid, not a verdict.</strong>
      The model is a simplification of real conversation; treat these numbers as a planning aid. A person's score says where they sit in the
      map, not what they are worth: never use it to judge or rank people's performance.
    </aside>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ModelCaution {}
