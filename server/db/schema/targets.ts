import { sqliteTable, integer, text, real, index } from 'drizzle-orm/sqlite-core';
import { organizations } from './organizations';
import { SOURCE_UNITS, TARGET_CONFIDENCE } from '@shared/schemas/targets';

/** Target library: shipped entries have no organisation; an organisation may add its own. */
export const targets = sqliteTable('targets', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  organizationId: integer('organization_id').references(() => organizations.id),
  useType: text('use_type').notNull(),
  name: text('name').notNull(),
  emLux: real('em_lux').notNull(),
  /** The unit the source states its value in; emLux is always lux. */
  sourceUnit: text('source_unit', { enum: SOURCE_UNITS }).notNull().default('lx'),
  u0Min: real('u0_min'),
  /** EN 12464-1:2021 fields, null where the entry gives none (entries made before them keep working). */
  emModifiedLux: real('em_modified_lux'),
  ezLux: real('ez_lux'),
  emWallLux: real('em_wall_lux'),
  emCeilingLux: real('em_ceiling_lux'),
  /** For information only: a meter cannot measure colour rendering or glare. */
  ra: integer('ra'),
  rugl: integer('rugl'),
  dfTargetPercent: real('df_target_percent'),
  source: text('source').notNull(),
  confidence: text('confidence', { enum: TARGET_CONFIDENCE }).notNull(),
  createdAt: integer('created_at').notNull(),
}, (t) => [index('targets_org_idx').on(t.organizationId)]);
