import { jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import { users } from './auth';
import { boardModels } from './boards';

/**
 * The board capture being worked on for a board model (points, connectors and sections marked on its photo), with
 * what the engine computed from it when it was saved. One draft per board; publishing it makes a version.
 */
export const boardDrafts = pgTable('board_drafts', {
  boardId: text('board_id')
    .primaryKey()
    .references(() => boardModels.id),
  capture: jsonb('capture').notNull(),
  /** The saved draft's results (expected values per point, modelled nets, the composed netlist, a problem). */
  result: jsonb('result').notNull(),
  savedBy: text('saved_by').references(() => users.id),
  savedAt: timestamp('saved_at', { withTimezone: true }).notNull().defaultNow(),
});
