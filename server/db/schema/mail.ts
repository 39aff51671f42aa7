import { mysqlTable, int, varchar, text, mysqlEnum, json, index } from 'drizzle-orm/mysql-core'
import { timestamps, utcDatetime } from './common'

/**
 * A file of a queued e-mail. With a `cid` it is an image the HTML shows inline (`<img src="cid:…">`,
 * RFC 2392) rather than a file to download.
 */
export interface OutboxAttachment { filename: string, contentType: string, contentBase64: string, cid?: string }

/**
 * Every e-mail is written here first, in the same transaction as the change it reports, then
 * sent; a failed send stays pending and is retried, so SMTP trouble never loses a message.
 */
export const outbox = mysqlTable('outbox', {
  id: int('id').autoincrement().primaryKey(),
  toAddress: varchar('to_address', { length: 254 }).notNull(),
  subject: varchar('subject', { length: 300 }).notNull(),
  textBody: text('text_body').notNull(),
  htmlBody: text('html_body'),
  attachments: json('attachments').$type<OutboxAttachment[]>(),
  status: mysqlEnum('status', ['pending', 'sent', 'failed']).notNull().default('pending'),
  attempts: int('attempts').notNull().default(0),
  lastError: varchar('last_error', { length: 1000 }),
  nextAttemptAt: utcDatetime('next_attempt_at').notNull(),
  sentAt: utcDatetime('sent_at'),
  ...timestamps,
}, t => [
  index('outbox_due_idx').on(t.status, t.nextAttemptAt),
  // The overview's counts by status and its messages stuck since before a time: years of sent mail are not read.
  index('outbox_status_created_idx').on(t.status, t.createdAt),
])
