import type { Routes } from '@angular/router';

// Filled in by the participant feature.
export default [] satisfies Routes;
