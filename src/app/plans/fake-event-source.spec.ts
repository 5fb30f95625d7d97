// Shared by the plan and rehearsal page specs (a .spec file, so the app build never sees jasmine).
import type { JobEvent } from '../../../shared/api/plans';

/** Test stand-in for the browser's EventSource: a spec sends the server's job events by hand. */
export class FakeEventSource extends EventTarget {
  static readonly CLOSED = 2;
  static opened: FakeEventSource[] = [];
  readyState = 1;
  onerror: (() => void) | null = null;
  constructor(readonly url: string) {
    super();
    FakeEventSource.opened.push(this);
  }
  close(): void {
    this.readyState = 2;
  }
  send(e: JobEvent): void {
    this.dispatchEvent(new MessageEvent(e.type, { data: JSON.stringify(e) }));
  }
}

/** The stream the page opened last (a test fails here if it opened none). */
export function lastSource(): FakeEventSource {
  const s = FakeEventSource.opened.at(-1);
  if (!s) throw new Error('the page opened no event stream');
  return s;
}

/** Puts the fake in place of window.EventSource for each test of the calling describe block. */
export function useFakeEventSource(): void {
  let real: typeof EventSource;
  beforeEach(() => {
    real = window.EventSource;
    FakeEventSource.opened = [];
    (window as unknown as { EventSource: unknown }).EventSource = FakeEventSource;
  });
  afterEach(() => ((window as unknown as { EventSource: unknown }).EventSource = real));
}
