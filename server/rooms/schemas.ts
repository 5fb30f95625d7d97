/** Strict zod schemas for every rooms request, with messages that say what to fix. */
import { z } from 'zod';
import {
  PEOPLE_SORTS,
  ROOM_LIMITS as L,
  ROOM_SORTS,
  SETTINGS_LIMITS as S,
  SHARE_ROLES,
  TIE_SORTS,
  type RoomEditOp,
} from '../../shared/api/rooms';
import { LIST_LIMITS, pageQueryFields } from '../../shared/api/lists';
import { coordinate, newPerson, newRoomTie, personFields, strength } from '../../shared/api/room-rules';

const text = (what: string, max: number) =>
  z
    .string({ error: `Enter the ${what} as text.` })
    .trim()
    .max(max, `The ${what} can be at most ${max} characters.`);

const required = (what: string, max: number) => text(what, max).min(1, `Enter the ${what}.`);

export const roomName = required('room name', L.roomNameMax);
const description = text('description', L.descriptionMax);

const between = (what: string, min: number, max: number, closedMax = true) =>
  z
    .number({ error: `Enter ${what} as a number.` })
    .min(min, `${what} must be at least ${min}.`)
    [closedMax ? 'max' : 'lt'](max, `${what} must be ${closedMax ? 'at most' : 'below'} ${max}.`);

export const settingsPatch = z.strictObject({
  directed: z.boolean({ error: 'Directed must be true or false.' }).optional(),
  minutesPerHop: between('Minutes per hop', S.minutesPerHop.min, S.minutesPerHop.max).optional(),
  laziness: between('Laziness', S.laziness.min, S.laziness.max).optional(),
  mixing: between('Background mixing', S.mixing.min, S.mixing.max).optional(),
});

export type NewPersonInput = z.infer<typeof newPerson>;

export const createRoomBody = z.strictObject({
  name: roomName,
  description: description.optional(),
  settings: settingsPatch.optional(),
  people: z.array(newPerson).max(L.maxPeople, `A room can hold at most ${L.maxPeople} people.`).optional(),
  ties: z.array(newRoomTie).max(L.maxTies, `A room can hold at most ${L.maxTies} ties.`).optional(),
});
export type CreateRoomInput = z.infer<typeof createRoomBody>;

const version = z.number({ error: 'Send the room version you started from.' }).int().min(1);

export const updateRoomBody = z
  .strictObject({ version, name: roomName.optional(), description: description.optional(), settings: settingsPatch.optional() })
  .refine((b) => b.name !== undefined || b.description !== undefined || b.settings !== undefined, 'Nothing to change.');

export const duplicateBody = z.strictObject({ name: roomName.optional() });

const ref = z.union(
  [z.number().int().positive(), z.string().trim().min(1).max(64)],
  'Name the person by id (a number) or by the tempId given in this batch.',
);
const tempId = z.string().trim().min(1, 'Give the new item a tempId.').max(64);
const id = z.number({ error: 'Give the id as a number.' }).int().positive();

const editOp = z.discriminatedUnion(
  'op',
  [
    z.strictObject({ op: z.literal('addPerson'), tempId, ...personFields }),
    z.strictObject({ op: z.literal('updatePerson'), id, ...personFields, name: z.optional(personFields.name) }),
    z.strictObject({ op: z.literal('deletePerson'), id }),
    z.strictObject({ op: z.literal('addTie'), tempId: tempId.optional(), source: ref, target: ref, strength }),
    z.strictObject({ op: z.literal('updateTie'), id, strength }),
    z.strictObject({ op: z.literal('deleteTie'), id }),
    z.strictObject({
      op: z.literal('movePeople'),
      moves: z
        .array(z.strictObject({ id: ref, x: coordinate, y: coordinate, pinned: z.boolean().optional() }))
        .min(1, 'Give at least one move.')
        .max(L.maxPeople),
    }),
  ],
  { error: 'Each op needs "op": addPerson, updatePerson, deletePerson, addTie, updateTie, deleteTie or movePeople.' },
);

export const editBatchBody = z.strictObject({
  version: version.optional(),
  ops: z.array(editOp).min(1, 'Send at least one op.').max(L.maxOpsPerBatch, `Send at most ${L.maxOpsPerBatch} ops in one batch.`),
});
export type EditBatchInput = z.infer<typeof editBatchBody>;
export type EditOpInput = z.infer<typeof editOp>;
// Keeps the zod shapes and the shared contract in step: a mismatch fails the type check.
export const opShapeCheck: (op: EditOpInput) => RoomEditOp = (op) => op;

const list = { ...LIST_LIMITS.rooms, direction: 'asc' } as const;

export const roomListQuery = z.strictObject({
  ...pageQueryFields({ ...list, sorts: ROOM_SORTS, sort: 'updatedAt' }),
  scope: z.enum(['all', 'mine', 'shared']).default('all'),
});
export const peopleQuery = z.strictObject({
  ...pageQueryFields({ ...list, sorts: PEOPLE_SORTS, sort: 'order' }),
  group: z.string().trim().max(L.groupMax).optional(),
});
export const tiesQuery = z.strictObject({
  ...pageQueryFields({ ...list, sorts: TIE_SORTS, sort: 'source' }),
  personId: z.coerce.number().int().positive().optional(),
});

export const shareBody = z.strictObject({
  email: z.string().trim().toLowerCase().email('Enter the e-mail address of a facilitator account.').max(L.emailMax),
  role: z.enum(SHARE_ROLES, 'The role must be editor or viewer.'),
});
export const shareRoleBody = z.strictObject({ role: z.enum(SHARE_ROLES, 'The role must be editor or viewer.') });
