import type { PendingTasks } from '@angular/core';

/** Longest wait for an idle moment before a step runs anyway, ms. */
const IDLE_WAIT_MS = 300;

/**
 * Runs `steps` one per task, each once the browser has painted another frame and is idle (an
 * animation frame, then an idle callback, or a timeout where there are none), so costly drawing
 * never holds back what is already on the page, and input and other work go first. Angular's
 * whenStable waits for the steps. The returned function cancels the steps not yet run.
 */
export function inPaintedTurns(tasks: PendingTasks, steps: readonly (() => void)[]): () => void {
  const done = tasks.add();
  let frame: number | undefined;
  let later: (() => void) | undefined;
  let stopped = false;
  const whenIdle = (run: () => void): (() => void) => {
    if (typeof requestIdleCallback === 'function') {
      const id = requestIdleCallback(run, { timeout: IDLE_WAIT_MS });
      return () => cancelIdleCallback(id);
    }
    const id = setTimeout(run);
    return () => clearTimeout(id);
  };
  const next = (i: number) => {
    if (i >= steps.length) {
      done();
      return;
    }
    frame = requestAnimationFrame(() => {
      later = whenIdle(() => {
        if (stopped) return;
        steps[i]?.();
        next(i + 1);
      });
    });
  };
  next(0);
  return () => {
    stopped = true;
    if (frame !== undefined) cancelAnimationFrame(frame);
    later?.();
    done();
  };
}
