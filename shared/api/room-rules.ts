/**
 * The rules of a person and a tie as zod schemas, with the one message for each problem: the
 * server's request schemas (server/rooms/schemas.ts) are built from them, and the room editor's
 * form validators (src/app/rooms/editor/validation.ts) run the same schemas, so a form and the
 * API refuse the same values with the same words. No Node or DOM imports.
 */
import { z } from 'zod';
import { ROOM_LIMITS as L } from './rooms';

const count = (n: number) => n.toLocaleString('en-US');

/** Text of at most `max` characters, trimmed. */
const text = (what: string, max: number) =>
  z
    .string({ error: `Enter the ${what} as text.` })
    .trim()
    .max(max, `At most ${count(max)} characters for ${what === 'e-mail address' ? 'an' : 'a'} ${what}.`);

export const NOT_A_STRENGTH = 'Give a number, e.g. 1 or 2.5.';

export const strength = z
  .number({ error: NOT_A_STRENGTH })
  .refine((v) => Number.isFinite(v), NOT_A_STRENGTH)
  .refine((v) => v > 0, 'A tie needs a strength above 0 (delete the tie if there is none).')
  .refine((v) => v <= L.maxStrength, `At most ${count(L.maxStrength)} for a strength: check the unit or rescale.`);

export const personName = text('name', L.personNameMax).min(1, 'A name is needed.');

export const personKey = text('key', L.personKeyMax)
  .min(1, 'A key is needed (it names the person in files).')
  .regex(/^[^\r\n\t]*$/, 'A key cannot contain line breaks or tabs.');

export const group = text('group', L.groupMax);

const anEmail = z.email();

/** Optional: empty text means none. */
export const email = text('e-mail address', L.emailMax)
  .toLowerCase()
  .refine(
    (v) => v === '' || anEmail.safeParse(v).success,
    'This does not look like an e-mail address (name@example.org); leave it empty if there is none.',
  );

export const coordinate = z
  .number({ error: 'Positions must be numbers.' })
  .refine((v) => Number.isFinite(v) && Math.abs(v) <= 1e7, 'Positions must be finite numbers within +-10,000,000.');

/** Empty text and null both mean "none". */
const orNone = <T extends z.ZodType<string>>(schema: T) =>
  z
    .union([schema, z.null()])
    .transform((v) => (v === '' ? null : v))
    .optional();

/** The fields of a person in a request (create room, addPerson, updatePerson). */
export const personFields = {
  key: personKey.optional(),
  name: personName,
  group: orNone(group),
  email: orNone(email),
  x: z.union([coordinate, z.null()]).optional(),
  y: z.union([coordinate, z.null()]).optional(),
  pinned: z.boolean().optional(),
};

export const newPerson = z.strictObject(personFields);

/** A tie of a new room names its people by key. */
export const newRoomTie = z.strictObject({
  source: personKey,
  target: personKey,
  strength: strength.optional(),
});

/** The first message a schema gives for a value, or null when it passes: for form validators. */
export function ruleProblem(schema: z.ZodType, value: unknown): string | null {
  const result = schema.safeParse(value);
  return result.success ? null : (result.error.issues[0]?.message ?? 'Check this value.');
}
