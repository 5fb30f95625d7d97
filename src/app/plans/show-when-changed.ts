import type { AbstractControl } from '@angular/forms';
import type { ErrorStateMatcher } from '@angular/material/core';

/** Field errors show as soon as the field was changed or left (not only after a submit, which stays disabled while invalid). */
export class ShowWhenChanged implements ErrorStateMatcher {
  isErrorState(control: AbstractControl | null): boolean {
    return !!control && control.invalid && (control.dirty || control.touched);
  }
}
