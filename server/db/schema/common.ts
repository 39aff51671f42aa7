import { datetime } from 'drizzle-orm/mysql-core'
import { sql } from 'drizzle-orm'

/** Instants are stored in UTC (the pool sets the connection time zone to +00:00). */
export const utcDatetime = (name: string) => datetime(name, { mode: 'date', fsp: 3 })

export const timestamps = {
  createdAt: utcDatetime('created_at').notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  updatedAt: utcDatetime('updated_at').notNull().default(sql`CURRENT_TIMESTAMP(3)`).$onUpdate(() => new Date()),
}
