import type { PlanMethodChoice, PlanMethodUsed } from '../../../shared/api/plans';

/** Plain names of the planning methods as shown on screens and sheets: the one list of them. */
export const METHOD_LABELS: Record<PlanMethodChoice | PlanMethodUsed, string> = {
  auto: 'Automatic',
  greedy: 'Greedy',
  widened: 'Widened greedy',
  swap: 'Swap polish',
  exhaustive: 'Exhaustive',
  'lazy-greedy': 'Greedy (large room)',
  screen: 'Quick screen (very large rooms)',
  'hand-made': 'Hand-made',
};

export function methodLabel(method: string | null | undefined): string {
  return method ? ((METHOD_LABELS as Record<string, string>)[method] ?? method) : '—';
}
