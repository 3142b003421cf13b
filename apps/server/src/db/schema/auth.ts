import { index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';

export const roleEnum = pgEnum('role', ['admin', 'lead', 'tech', 'trainee']);

export const shops = pgTable('shops', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  /** The shop's running job number: the next job takes this one. */
  nextJobNumber: integer('next_job_number').notNull().default(1001),
  /** What customers see on reports, e-mails and the customer page. */
  address: text('address'),
  phone: text('phone'),
  email: text('email'),
  taxNumber: text('tax_number'),
  /** An upload of this shop (its id); the logo on reports and the customer page. */
  logoUploadId: text('logo_upload_id'),
  /** Session lifetime the shop sets: signed out after this long without a request, and after this long at most. */
  sessionIdleHours: integer('session_idle_hours').notNull().default(12),
  sessionMaxDays: integer('session_max_days').notNull().default(30),
  /** The meter profile a job uses unless it names another (a shipped profile id); null = the engine's generic meter. */
  meterProfile: text('meter_profile'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const users = pgTable(
  'users',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: roleEnum('role').notNull(),
    passwordHash: text('password_hash').notNull(),
    /** Set when an admin deactivates the person: no sign-in, no session, kept for the history they wrote. */
    deactivatedAt: timestamp('deactivated_at', { withTimezone: true }),
    /** For a trainee: the lead who lifted guided order on all their jobs; null while guided order binds. */
    guidedLiftedBy: text('guided_lifted_by'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email), index('users_shop_idx').on(t.shopId)],
);

/** Who wrote a row and when: the last two columns of every row a person adds to a job's history. */
export const authorColumns = () => ({
  createdBy: text('created_by')
    .notNull()
    .references(() => users.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

// lucia's session table: id, user_id, expires_at are the columns its Drizzle adapter expects.
export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    /** Idle expiry: moved forward while the session is used, never past created_at + the shop's longest lifetime. */
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
    createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const auditLog = pgTable(
  'audit_log',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id').references(() => shops.id),
    userId: text('user_id'),
    action: text('action').notNull(),
    subject: text('subject'),
    detail: text('detail'),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('audit_shop_idx').on(t.shopId, t.at)],
);

/** An admin's invitation to join the shop; only a hash of the one-time token is kept. */
export const invitations = pgTable(
  'invitations',
  {
    id: text('id').primaryKey(),
    shopId: text('shop_id')
      .notNull()
      .references(() => shops.id),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: roleEnum('role').notNull(),
    tokenHash: text('token_hash').notNull(),
    invitedBy: text('invited_by')
      .notNull()
      .references(() => users.id),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('invitations_token_unique').on(t.tokenHash), index('invitations_shop_idx').on(t.shopId)],
);

/** A password reset by e-mail link: single use, short-lived, only a hash of the token is kept. */
export const passwordResets = pgTable(
  'password_resets',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    tokenHash: text('token_hash').notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('password_resets_token_unique').on(t.tokenHash), index('password_resets_user_idx').on(t.userId)],
);
