/**
 * The rules of a person and a tie as zod schemas, with the one message for each problem: the
 * server's request schemas (server/rooms/schemas.ts) are built from them, and the room editor's
 * form validators (src/app/rooms/editor/validation.ts) run the same schemas, so a form and the
 * API refuse the same values with the same words. No Node or DOM imports.
 */
import * as z from 'zod/mini';
import { ROOM_LIMITS as L } from './rooms';

// zod/mini: the same schemas and checks as 'zod', in a form the client's bundle can shake (the room
// editor loads this file); the server's 'zod' objects take these schemas as fields.

const count = (n: number) => n.toLocaleString('en-US');

/** Text of at most `max` characters, trimmed. */
const text = (what: string, max: number) =>
  z
    .string({ error: `Enter the ${what} as text.` })
    .check(z.trim(), z.maxLength(max, `At most ${count(max)} characters for ${what === 'e-mail address' ? 'an' : 'a'} ${what}.`));

export const NOT_A_STRENGTH = 'Give a number, e.g. 1 or 2.5.';

export const strength = z.number({ error: NOT_A_STRENGTH }).check(
  z.refine((v) => v > 0, 'A tie needs a strength above 0 (delete the tie if there is none).'),
  z.refine((v) => v <= L.maxStrength, `At most ${count(L.maxStrength)} for a strength: check the unit or rescale.`),
);

export const personName = text('name', L.personNameMax).check(z.minLength(1, 'A name is needed.'));

export const personKey = text('key', L.personKeyMax).check(
  z.minLength(1, 'A key is needed (it names the person in files).'),
  z.regex(/^[^\r\n\t]*$/, 'A key cannot contain line breaks or tabs.'),
);

export const group = text('group', L.groupMax);

const anEmail = z.email();

/** Optional: empty text means none. */
export const email = text('e-mail address', L.emailMax).check(
  z.toLowerCase(),
  z.refine(
    (v) => v === '' || anEmail.safeParse(v).success,
    'This does not look like an e-mail address (name@example.org); leave it empty if there is none.',
  ),
);

export const coordinate = z
  .number({ error: 'Positions must be numbers.' })
  .check(z.refine((v) => Math.abs(v) <= 1e7, 'Positions must be finite numbers within +-10,000,000.'));

/** Empty text and null both mean "none". */
const orNone = (schema: z.ZodMiniType<string, string>) =>
  z.optional(
    z.pipe(
      z.union([schema, z.null()]),
      z.transform((v: string | null) => (v === '' ? null : v)),
    ),
  );

/** The fields of a person in a request (create room, addPerson, updatePerson). */
export const personFields = {
  key: z.optional(personKey),
  name: personName,
  group: orNone(group),
  email: orNone(email),
  x: z.optional(z.union([coordinate, z.null()])),
  y: z.optional(z.union([coordinate, z.null()])),
  pinned: z.optional(z.boolean()),
};

export const newPerson = z.strictObject(personFields);

/** A tie of a new room names its people by key. */
export const newRoomTie = z.strictObject({
  source: personKey,
  target: personKey,
  strength: z.optional(strength),
});

/** The first message a schema gives for a value, or null when it passes: for form validators. */
export function ruleProblem(schema: z.ZodMiniType, value: unknown): string | null {
  const result = schema.safeParse(value);
  return result.success ? null : (result.error.issues[0]?.message ?? 'Check this value.');
}
