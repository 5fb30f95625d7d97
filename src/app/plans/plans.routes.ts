import type { Routes } from '@angular/router';

// Filled in by the plans feature.
export default [] satisfies Routes;
