/**
 * The database schema: the single source for tables, migrations (drizzle-kit) and row types.
 *
 * Plain PostgreSQL (pg-core) with no PGlite-only SQL, so the same schema runs on a PostgreSQL server
 * through node-postgres. Timestamps are written from the injected clock, never `now()` defaults, so
 * tests with a fake clock are deterministic.
 */
import { sql } from 'drizzle-orm';
import {
  boolean,
  check,
  customType,
  doublePrecision,
  index,
  integer,
  json,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';

const createdAt = () => timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull();

/** A person who signs in. Email is unique regardless of case (stored as typed, compared lowered). */
export const users = pgTable(
  'users',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: text('role', { enum: ['student', 'instructor', 'admin'] }).notNull(),
    /** `scrypt$N$r$p$salt$hash` (base64url): the parameters travel with the hash. */
    passwordHash: text('password_hash').notNull(),
    /** Demo rows are marked so nobody mistakes them for real accounts. */
    demo: boolean('demo').notNull().default(false),
    createdAt: createdAt(),
    lastSignInAt: timestamp('last_sign_in_at', { withTimezone: true, mode: 'date' }),
    /** Set while an admin has deactivated the account: it cannot sign in and its sessions are ended. */
    deactivatedAt: timestamp('deactivated_at', { withTimezone: true, mode: 'date' }),
  },
  (t) => [
    uniqueIndex('users_email_lower_idx').on(sql`lower(${t.email})`),
    check('users_role_check', sql`${t.role} in ('student', 'instructor', 'admin')`),
  ],
);

/** A class an instructor teaches; students join it with the join code. */
export const classes = pgTable(
  'classes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    name: text('name').notNull(),
    term: text('term').notNull(),
    instructorId: uuid('instructor_id')
      .notNull()
      .references(() => users.id),
    joinCode: text('join_code').notNull(),
    demo: boolean('demo').notNull().default(false),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('classes_join_code_idx').on(t.joinCode), index('classes_instructor_idx').on(t.instructorId)],
);

/** A student's membership of a class. */
export const enrolments = pgTable(
  'enrolments',
  {
    classId: uuid('class_id')
      .notNull()
      .references(() => classes.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.classId, t.userId] }), index('enrolments_user_idx').on(t.userId)],
);

/** A panel layout (the virtual trainer's configuration); `ownerId` null = built in. */
export const panelLayouts = pgTable('panel_layouts', {
  id: uuid('id').primaryKey().defaultRandom(),
  ownerId: uuid('owner_id').references(() => users.id),
  name: text('name').notNull(),
  layout: jsonb('layout').notNull(),
  createdAt: createdAt(),
});

/** Raw bytes (PostgreSQL `bytea`), read and written as a Node Buffer. */
const bytea = customType<{ data: Buffer; driverData: Uint8Array }>({
  dataType: () => 'bytea',
  toDriver: (value) => value,
  fromDriver: (value) => Buffer.from(value),
});

/**
 * A lab an instructor publishes to a class. `panel` is `{ kind: 'builtIn', id }` or
 * `{ kind: 'custom', layout }` (shared/api/labs.ts); `checkScript` is the whole script, hidden
 * checks included, and never leaves the server for a student.
 */
export const labs = pgTable(
  'labs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    classId: uuid('class_id')
      .notNull()
      .references(() => classes.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id')
      .notNull()
      .references(() => users.id),
    title: text('title').notNull(),
    summary: text('summary').notNull().default(''),
    brief: text('brief').notNull().default(''),
    panelLayoutId: uuid('panel_layout_id').references(() => panelLayouts.id),
    panel: jsonb('panel').notNull().default({ kind: 'builtIn', id: 'reversing-conveyor' }),
    starterKind: text('starter_kind', { enum: ['empty', 'program', 'template'] }).notNull().default('empty'),
    starterProgramId: uuid('starter_program_id'),
    starterVersion: integer('starter_version'),
    starterDocument: jsonb('starter_document'),
    checkScript: jsonb('check_script'),
    totalPoints: integer('total_points').notNull().default(100),
    dueAt: timestamp('due_at', { withTimezone: true, mode: 'date' }),
    latePolicy: jsonb('late_policy').notNull().default({ kind: 'accept' }),
    templateId: text('template_id'),
    demo: boolean('demo').notNull().default(false),
    publishedAt: timestamp('published_at', { withTimezone: true, mode: 'date' }),
    createdAt: createdAt(),
    updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }),
  },
  (t) => [index('labs_class_idx').on(t.classId)],
);

/** A file attached to a lab (wiring diagram): PNG, JPEG or PDF, its type read from its first bytes. */
export const labAttachments = pgTable(
  'lab_attachments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    labId: uuid('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'cascade' }),
    filename: text('filename').notNull(),
    contentType: text('content_type', { enum: ['image/png', 'image/jpeg', 'application/pdf'] }).notNull(),
    size: integer('size').notNull(),
    data: bytea('data').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('lab_attachments_lab_idx').on(t.labId)],
);

/** A ladder program a user owns; its content lives in immutable versions. */
export const programs = pgTable(
  'programs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    ownerId: uuid('owner_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    title: text('title').notNull(),
    labId: uuid('lab_id').references(() => labs.id, { onDelete: 'set null' }),
    /** Number of the newest version (1-based); a save must name it as its base. */
    headVersion: integer('head_version').notNull(),
    demo: boolean('demo').notNull().default(false),
    createdAt: createdAt(),
    updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [index('programs_owner_idx').on(t.ownerId)],
);

/** One immutable saved state of a program. Never updated, never deleted on its own. */
export const programVersions = pgTable(
  'program_versions',
  {
    programId: uuid('program_id')
      .notNull()
      .references(() => programs.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    document: jsonb('document').notNull(),
    message: text('message').notNull(),
    authorId: uuid('author_id')
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.programId, t.number] })],
);

/**
 * A student's submission of one saved program version to a lab. The version's document is copied
 * in, so the graded program stays readable even if the student deletes the program later.
 * `autoScore` is the report's score scaled to the lab's points, after a late penalty; `score` is
 * the final score (the override when there is one, else the auto score).
 */
export const submissions = pgTable(
  'submissions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    labId: uuid('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'cascade' }),
    studentId: uuid('student_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    programId: uuid('program_id').references(() => programs.id, { onDelete: 'set null' }),
    versionNumber: integer('version_number').notNull(),
    document: jsonb('document'),
    status: text('status', { enum: ['submitted', 'graded', 'returned'] }).notNull(),
    late: boolean('late').notNull().default(false),
    penaltyPercent: doublePrecision('penalty_percent').notNull().default(0),
    report: jsonb('report'),
    gradingNote: text('grading_note'),
    autoScore: doublePrecision('auto_score'),
    overrideScore: doublePrecision('override_score'),
    overrideReason: text('override_reason'),
    score: doublePrecision('score'),
    feedback: text('feedback'),
    submittedAt: timestamp('submitted_at', { withTimezone: true, mode: 'date' }).notNull(),
    gradedAt: timestamp('graded_at', { withTimezone: true, mode: 'date' }),
    returnedAt: timestamp('returned_at', { withTimezone: true, mode: 'date' }),
  },
  (t) => [index('submissions_lab_idx').on(t.labId), index('submissions_student_idx').on(t.studentId)],
);

/** A report a regrade replaced, kept so the instructor can see what changed. */
export const gradeHistory = pgTable(
  'grade_history',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    submissionId: uuid('submission_id')
      .notNull()
      .references(() => submissions.id, { onDelete: 'cascade' }),
    report: jsonb('report'),
    gradingNote: text('grading_note'),
    autoScore: doublePrecision('auto_score'),
    gradedAt: timestamp('graded_at', { withTimezone: true, mode: 'date' }).notNull(),
    replacedAt: timestamp('replaced_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [index('grade_history_submission_idx').on(t.submissionId)],
);

/** A student's own copy of a lab's starter, made on first open (one per student and lab). */
export const labCopies = pgTable(
  'lab_copies',
  {
    labId: uuid('lab_id')
      .notNull()
      .references(() => labs.id, { onDelete: 'cascade' }),
    studentId: uuid('student_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    programId: uuid('program_id')
      .notNull()
      .references(() => programs.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.labId, t.studentId] })],
);

/**
 * A one-time link (instructor or student invitation, password reset, finishing a sign-up). Only a
 * SHA-256 of the token is stored, so a copy of the database cannot be used to sign in. `kind` has
 * no CHECK constraint in the database, so a new kind needs no migration.
 */
export const oneTimeTokens = pgTable(
  'one_time_tokens',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    kind: text('kind', { enum: ['invite', 'reset', 'signup'] }).notNull(),
    tokenHash: text('token_hash').notNull(),
    email: text('email').notNull(),
    /** The account the token acts on (reset), null for an invitation to someone new. */
    userId: uuid('user_id').references(() => users.id, { onDelete: 'cascade' }),
    /** For an invitation: the role the new account gets. */
    role: text('role', { enum: ['student', 'instructor', 'admin'] }),
    /** For a student invitation from a roster, or a sign-up with a join code: the class to join. */
    classId: uuid('class_id').references(() => classes.id, { onDelete: 'cascade' }),
    invitedName: text('invited_name'),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true, mode: 'date' }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('one_time_tokens_hash_idx').on(t.tokenHash)],
);

/**
 * A signed-in session. The cookie's token names its row (`sid`), so signing out, a password change
 * or reset, "sign out everywhere" and deactivation end sessions by revoking rows, and every app
 * process sharing the database sees it at once.
 */
export const sessions = pgTable(
  'sessions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
    revokedAt: timestamp('revoked_at', { withTimezone: true, mode: 'date' }),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

/**
 * Throttling counters (failed sign-ins per account and per address, expensive calls per user), in
 * the database so that several app processes count together. `key` says what is counted, e.g.
 * `signin-account:<user id>`; `count` attempts since `windowStart`; `blockedUntil` a back-off.
 */
export const rateCounters = pgTable('rate_counters', {
  key: text('key').primaryKey(),
  windowStart: timestamp('window_start', { withTimezone: true, mode: 'date' }).notNull(),
  count: integer('count').notNull(),
  blockedUntil: timestamp('blocked_until', { withTimezone: true, mode: 'date' }),
});

/**
 * Unsaved editor state kept on the server, one per user and program: never a version. Offered back
 * when it is newer than the program's head; `baseVersion` is the version the edits started from.
 */
export const drafts = pgTable(
  'drafts',
  {
    programId: uuid('program_id')
      .notNull()
      .references(() => programs.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    baseVersion: integer('base_version').notNull(),
    document: jsonb('document').notNull(),
    updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.programId, t.userId] })],
);

/**
 * A program's proof sheet: the properties its owner asked the prover to decide and the checks they
 * kept from counterexamples, one row per program (only the owner reads or writes it; `user_id` is
 * the owner who wrote it). Both lists are stored as the shared schema accepted them
 * (`ProofSheetSchema` in shared/api/proof.ts); the row goes with its program. `json`, not `jsonb`:
 * jsonb reorders an object's keys, and the order of a condition's keys is the order its plain-words
 * label names them in ("never K2 closed and K1 closed" must come back as written).
 */
export const proofSheets = pgTable('proof_sheets', {
  programId: uuid('program_id')
    .primaryKey()
    .references(() => programs.id, { onDelete: 'cascade' }),
  userId: uuid('user_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  properties: json('properties').notNull(),
  checks: json('checks').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull(),
});

/** Mail the local fake SMTP server received (only when SMTP_URL is unset). */
export const sentMail = pgTable('sent_mail', {
  id: uuid('id').primaryKey().defaultRandom(),
  from: text('from_address').notNull(),
  to: text('to_address').notNull(),
  subject: text('subject').notNull(),
  text: text('text_body').notNull(),
  html: text('html_body').notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true, mode: 'date' }).notNull(),
});

/** A user as the services see it (the hash stays in the db layer unless asked for). */
export interface User {
  id: string;
  email: string;
  name: string;
  role: 'student' | 'instructor' | 'admin';
  demo: boolean;
  createdAt: Date;
  lastSignInAt: Date | null;
  /** Set while an admin has deactivated the account (it cannot sign in; its sessions were ended). */
  deactivatedAt: Date | null;
}

export type UserRow = typeof users.$inferSelect;
export type ClassRow = typeof classes.$inferSelect;
export type ProgramRow = typeof programs.$inferSelect;
export type ProgramVersionRow = typeof programVersions.$inferSelect;
export type OneTimeTokenRow = typeof oneTimeTokens.$inferSelect;
export type SentMailRow = typeof sentMail.$inferSelect;
export type LabRow = typeof labs.$inferSelect;
export type LabAttachmentRow = typeof labAttachments.$inferSelect;
export type SubmissionRowDb = typeof submissions.$inferSelect;
export type GradeHistoryRow = typeof gradeHistory.$inferSelect;
export type SessionRow = typeof sessions.$inferSelect;
export type RateCounterRow = typeof rateCounters.$inferSelect;
export type DraftRow = typeof drafts.$inferSelect;
export type ProofSheetRow = typeof proofSheets.$inferSelect;
