import type { Routes } from '@angular/router';

// Filled in by the admin feature.
export default [] satisfies Routes;
