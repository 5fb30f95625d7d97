/**
 * A chunk's accumulators as text for the job queue, bit for bit: typed arrays travel as the
 * base64 of their bytes (so -0, NaN and every double survive), plain numbers as JSON (which
 * round-trips every finite double exactly).
 */
import type { SampleCascade, SimPartial } from '../../shared/engine/simulate/partial';

type Typed = Float64Array | Int32Array | Uint8Array;
const KINDS = { f64: Float64Array, i32: Int32Array, u8: Uint8Array } as const;
type Kind = keyof typeof KINDS;

function kindOf(a: Typed): Kind {
  if (a instanceof Float64Array) return 'f64';
  if (a instanceof Int32Array) return 'i32';
  return 'u8';
}

function pack(a: Typed): { t: Kind; b: string } {
  return { t: kindOf(a), b: Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64') };
}

function unpack(p: { t: Kind; b: string }): Typed {
  const bytes = Buffer.from(p.b, 'base64');
  const Ctor = KINDS[p.t];
  if (!Ctor) throw new Error(`unknown array kind ${String(p.t)}`);
  // Copy into a fresh, aligned buffer.
  const copy = new Uint8Array(bytes.length);
  copy.set(bytes);
  return new Ctor(copy.buffer, 0, bytes.length / Ctor.BYTES_PER_ELEMENT);
}

function isTyped(v: unknown): v is Typed {
  return v instanceof Float64Array || v instanceof Int32Array || v instanceof Uint8Array;
}

export function encodePartial(p: SimPartial): string {
  return JSON.stringify(p, (_key, value: unknown) => (isTyped(value) ? { __typed: pack(value) } : value));
}

export function decodePartial(text: string): SimPartial {
  const out = JSON.parse(text, (_key, value: unknown) => {
    if (value && typeof value === 'object' && '__typed' in value) return unpack((value as { __typed: { t: Kind; b: string } }).__typed);
    return value;
  }) as SimPartial & { samples: SampleCascade[] };
  if (out.kind !== 'sim-partial' || !(out.mean instanceof Float64Array)) throw new Error('not a rehearsal chunk result');
  return out;
}
