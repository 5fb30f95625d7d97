/**
 * A web process's short-lived copy of the session rows it read (with their accounts), so a burst
 * of signed-in requests costs one database read per session and `SESSION_CACHE_MS` instead of
 * one per request.
 *
 * What bounds a stale answer:
 * - every copy is used for at most `ttlMs` after its read began; a change made by another
 *   process, or straight in the database, counts here within that time;
 * - a change made by this process (sign-in, sign-out, `endSessionsOf`, any write to an account)
 *   forgets the copies it touches before and after its write, and a read that was in flight
 *   across such a change is handed to its callers but never kept;
 * - a copy whose session expires within `ttlMs` is read again, so a session another process
 *   kept alive (touch) is never refused on an old expiry.
 * Only sessions that exist are kept: an unknown id is read afresh every time.
 */
import type { SessionAccount } from './session-store';

export interface CachedSession {
  /** The stored session data, as JSON: each request parses its own copy (express-session changes it). */
  data: string;
  /** Expiry, epoch seconds (as stored). */
  expires: number;
  account: SessionAccount | null;
}

interface Entry {
  value: CachedSession;
  /** When the read that produced it began (ms, from `now`). */
  readAt: number;
}

const live = new Set<SessionCache>();

export class SessionCache {
  private readonly entries = new Map<string, Entry>();
  private readonly pending = new Map<string, Promise<CachedSession | null>>();
  /** Bumped by every change: a read begun before it is not kept. */
  private generation = 0;

  constructor(
    readonly ttlMs: number,
    private readonly now: () => number = Date.now,
    private readonly maxEntries = 20_000,
  ) {
    live.add(this);
  }

  /**
   * The session `sid`: this process's copy while it is fresh, else `load()` (one load at a time
   * per session: requests arriving meanwhile share it).
   */
  read(sid: string, load: () => Promise<CachedSession | null>): Promise<CachedSession | null> {
    if (this.ttlMs <= 0) return load();
    const now = this.now();
    const hit = this.entries.get(sid);
    if (hit && now - hit.readAt < this.ttlMs && hit.value.expires * 1000 - now > this.ttlMs) return Promise.resolve(hit.value);
    const shared = this.pending.get(sid);
    if (shared) return shared;
    const generation = this.generation;
    const settle = () => {
      if (this.pending.get(sid) === loading) this.pending.delete(sid);
    };
    const loading: Promise<CachedSession | null> = load().then(
      (value) => {
        settle();
        if (value && generation === this.generation) this.keep(sid, { value, readAt: now });
        else this.entries.delete(sid);
        return value;
      },
      (err: unknown) => {
        settle();
        throw err;
      },
    );
    this.pending.set(sid, loading);
    return loading;
  }

  /** Forget the copy of one session (it was saved or destroyed). */
  forget(sid: string): void {
    this.generation++;
    this.entries.delete(sid);
    this.pending.delete(sid);
  }

  /** Forget every copy of an account's sessions (its role, status or password changed, or its sessions were ended). */
  forgetAccount(userId: number): void {
    this.generation++;
    // Which account a read in flight belongs to is not known yet: none of them is shared any more.
    this.pending.clear();
    for (const [sid, entry] of this.entries) if (entry.value.account?.id === userId) this.entries.delete(sid);
  }

  /** Copies held now (for tests). */
  get size(): number {
    return this.entries.size;
  }

  /** Stop counting this cache among the process's caches (a store that is no longer used). */
  close(): void {
    live.delete(this);
    this.entries.clear();
    this.pending.clear();
  }

  private keep(sid: string, entry: Entry): void {
    if (this.entries.size >= this.maxEntries) {
      const now = this.now();
      for (const [key, e] of this.entries) if (now - e.readAt >= this.ttlMs) this.entries.delete(key);
      // Still full of fresh copies: start over rather than grow without bound.
      if (this.entries.size >= this.maxEntries) this.entries.clear();
    }
    this.entries.set(sid, entry);
  }
}

/** Forget an account's sessions in every cache of this process (call before and after the change is written). */
export function forgetCachedAccount(userId: number): void {
  for (const cache of live) cache.forgetAccount(userId);
}
