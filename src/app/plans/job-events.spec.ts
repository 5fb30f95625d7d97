import type { JobEvent } from '../../../shared/api/plans';
import { jobEvents } from './job-events';

/** A stand-in EventSource the test drives by hand. */
class FakeSource extends EventTarget {
  readyState = 1;
  closed = false;
  onerror: (() => void) | null = null;
  close(): void {
    this.closed = true;
    this.readyState = 2;
  }
  emit(type: string, data: unknown): void {
    this.dispatchEvent(new MessageEvent(type, { data: JSON.stringify(data) }));
  }
}

const job = { id: 7, kind: 'rehearsal', status: 'running', progress: 0 } as JobEvent['job'];

describe('jobEvents', () => {
  it('passes every event on and completes after the final one, closing the stream', () => {
    const source = new FakeSource();
    const seen: string[] = [];
    let complete = false;
    jobEvents('/x', () => source as unknown as EventSource).subscribe({
      next: (e) => seen.push(`${e.type}:${e.fraction ?? ''}`),
      complete: () => (complete = true),
    });
    source.emit('queued', { type: 'queued', job, position: 2 });
    source.emit('progress', { type: 'progress', job, fraction: 0.5 });
    source.emit('done', { type: 'done', job: { ...job, status: 'done', progress: 1 } });
    source.emit('progress', { type: 'progress', job, fraction: 0.9 });
    expect(seen).toEqual(['queued:', 'progress:0.5', 'done:']);
    expect(complete).toBeTrue();
    expect(source.closed).toBeTrue();
  });

  it('closes the stream when the subscriber leaves, and errors when the server gives up early', () => {
    const a = new FakeSource();
    jobEvents('/x', () => a as unknown as EventSource)
      .subscribe()
      .unsubscribe();
    expect(a.closed).toBeTrue();
    const b = new FakeSource();
    let error: Error | null = null;
    jobEvents('/x', () => b as unknown as EventSource).subscribe({ error: (e) => (error = e) });
    b.readyState = 2;
    b.onerror?.();
    expect(error!.message).toContain('closed before the job finished');
  });
});
