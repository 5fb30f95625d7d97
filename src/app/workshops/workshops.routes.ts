import type { Routes } from '@angular/router';

// Filled in by the workshops feature.
export default [] satisfies Routes;
