import { bigint, timestamp } from 'drizzle-orm/mysql-core';

/** MariaDB rejects drizzle's serial(): ids are unsigned auto-increment bigints. */
export const idColumn = () => bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey();
/** A foreign key column matching idColumn. */
export const refColumn = (name: string) => bigint(name, { mode: 'number', unsigned: true });
export const createdAt = () => timestamp('created_at', { fsp: 3 }).notNull().defaultNow();
export const updatedAt = () => timestamp('updated_at', { fsp: 3 }).notNull().defaultNow().onUpdateNow();
