import type { Routes } from '@angular/router';

// Filled in by the rooms feature.
export default [] satisfies Routes;
