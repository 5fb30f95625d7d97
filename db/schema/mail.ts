import { index, longtext, mysqlTable, text, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, idColumn } from './columns';

/** Messages caught by the local SMTP fake (development and test only). */
export const mailMessages = mysqlTable(
  'mail_messages',
  {
    id: idColumn(),
    envelopeFrom: varchar('envelope_from', { length: 254 }),
    envelopeTo: text('envelope_to').notNull(),
    subject: varchar('subject', { length: 500 }),
    textBody: longtext('text_body'),
    htmlBody: longtext('html_body'),
    raw: longtext('raw').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('mail_messages_created_idx').on(t.createdAt)],
);
