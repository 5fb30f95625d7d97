import { Observable } from 'rxjs';
import type { JobEvent, JobEventType } from '../../../shared/api/plans';

const TYPES: readonly JobEventType[] = ['queued', 'started', 'progress', 'done', 'failed', 'cancelled', 'interrupted'];
const FINAL = new Set<JobEventType>(['done', 'failed', 'cancelled', 'interrupted']);

export function isFinalEvent(e: JobEvent): boolean {
  return FINAL.has(e.type);
}

/**
 * A job's server-sent events as an Observable: one value per event, complete after the final one
 * (done, failed, cancelled, interrupted). Unsubscribing closes the EventSource. A dropped connection
 * before the final event is an error (the caller can re-read the job's state).
 */
export function jobEvents(
  url: string,
  factory: (url: string) => EventSource = (u) => new EventSource(u, { withCredentials: true }),
): Observable<JobEvent> {
  return new Observable<JobEvent>((subscriber) => {
    const source = factory(url);
    let finished = false;
    const onEvent = (msg: MessageEvent<string>) => {
      let event: JobEvent;
      try {
        event = JSON.parse(msg.data) as JobEvent;
      } catch {
        return;
      }
      subscriber.next(event);
      if (isFinalEvent(event)) {
        finished = true;
        source.close();
        subscriber.complete();
      }
    };
    for (const t of TYPES) source.addEventListener(t, onEvent as EventListener);
    source.onerror = () => {
      if (finished) return;
      // EventSource retries by itself while CONNECTING; CLOSED means it gave up.
      if (source.readyState === EventSource.CLOSED) subscriber.error(new Error('The progress stream was closed before the job finished.'));
    };
    return () => {
      finished = true;
      source.close();
    };
  });
}
