import { HttpContextToken } from '@angular/common/http';

/** Set on a request whose errors the caller shows itself (forms with field errors, 409 dialogs). */
export const HANDLES_ERRORS = new HttpContextToken<boolean>(() => false);
