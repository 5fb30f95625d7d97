/** Plain names of the planning methods as shown on screens and sheets. */
const LABELS: Record<string, string> = {
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
  return method ? (LABELS[method] ?? method) : '—';
}
