import { sqliteTable, integer, text, index } from 'drizzle-orm/sqlite-core';
import { organizations } from './organizations';

/** A building or outdoor area of an organisation; plans and surveys belong to one. */
export const sites = sqliteTable('sites', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').notNull().references(() => organizations.id),
  name: text('name').notNull(),
  address: text('address'),
  timeZone: text('time_zone').notNull(),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('sites_org_idx').on(t.organizationId)]);
