import { bigint, customType, index, integer, json, jsonb, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { users } from './identity';
import { projects } from './projects';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });

/**
 * The notebook model (DESIGN.md): a study has branches; a branch has one working draft and a chain of
 * immutable versions; a version is an ordered list of cell revisions; a cell keeps its id across
 * versions so comments, diffs and outputs follow it.
 */
export const studies = pgTable(
  'studies',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    title: text('title').notNull(),
    description: text('description').notNull().default(''),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    baselineVersionId: uuid('baseline_version_id').references((): AnyPgColumn => versions.id),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('studies_project_idx').on(t.projectId)],
);

export const branches = pgTable(
  'branches',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    studyId: uuid('study_id')
      .notNull()
      .references(() => studies.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    purpose: text('purpose').notNull().default(''),
    /** The version this branch was made from; null for a study's first branch. */
    forkedFromVersionId: uuid('forked_from_version_id').references((): AnyPgColumn => versions.id),
    /** The newest version on this branch; moved in the same transaction that inserts a version. */
    headVersionId: uuid('head_version_id').references((): AnyPgColumn => versions.id),
    archivedAt: timestamp('archived_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('branches_study_name_key').on(t.studyId, t.name)],
);

/** A cell's identity: stable across drafts and versions. */
export const cells = pgTable('cells', {
  id: uuid('id').primaryKey().defaultRandom(),
  studyId: uuid('study_id')
    .notNull()
    .references(() => studies.id, { onDelete: 'cascade' }),
  kind: text('kind').notNull(),
  createdBy: uuid('created_by').references(() => users.id),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * One cell as it is in a draft. Its id, kind, title, collapsed state and inputs are kept in
 * drafts.cells; its output keys in drafts.output_keys (server/src/notebook/draft-keys.ts joins them).
 */
export interface DraftCell {
  cellId: string;
  kind: string;
  title: string;
  collapsed: boolean;
  inputs: Record<string, unknown>;
  /** Output key of the last run of this cell from the draft, if any. */
  lastOutputKey?: string | null;
}

/** The output keys of a draft's cells (and of those in its trash), by cell id. */
export type DraftOutputKeys = Record<string, { last: string | null; good: string | null }>;

/**
 * The working draft of a branch. `revision` increases on every save; a save names the revision it was
 * based on and gets 409 when another save came first (optimistic concurrency).
 */
export const drafts = pgTable('drafts', {
  branchId: uuid('branch_id')
    .primaryKey()
    .references(() => branches.id, { onDelete: 'cascade' }),
  revision: integer('revision').notNull().default(0),
  cells: jsonb('cells').$type<DraftCell[]>().notNull().default([]),
  /** Recently deleted cells, newest first, so they can be brought back. */
  trash: jsonb('trash').$type<(DraftCell & { deletedAt: string; deletedBy: string | null })[]>().notNull().default([]),
  /**
   * The output keys of the cells in `cells` and `trash`: the last run's and the last ok run's, by cell
   * id. Kept apart from `cells` so a run, which records keys and edits nothing, writes this small value
   * and not the cells' inputs (a pasted table is tens of kB); runs do not change `revision`.
   */
  outputKeys: jsonb('output_keys').$type<DraftOutputKeys>().notNull().default({}),
  /**
   * Names the content of `cells` and `trash`: a trigger gives it a new number from a sequence on every
   * insert and every update that sets either (migration 0008), so a server that keeps a draft's parsed
   * cells by it reads them again only when they changed (notebook/draft-cells.ts).
   */
  cellsToken: bigint('cells_token', { mode: 'number' }).notNull().default(0),
  basedOnVersionId: uuid('based_on_version_id').references((): AnyPgColumn => versions.id),
  updatedBy: uuid('updated_by').references(() => users.id),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Immutable: one state of one cell. Shared by every version in which the cell is unchanged. */
export const cellRevisions = pgTable(
  'cell_revisions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    cellId: uuid('cell_id')
      .notNull()
      .references(() => cells.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    title: text('title').notNull(),
    inputs: jsonb('inputs').$type<Record<string, unknown>>().notNull(),
    /** Hash of kind, title and inputs, so an unchanged cell reuses its revision. */
    contentHash: text('content_hash').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('cell_revisions_cell_hash_key').on(t.cellId, t.contentHash)],
);

/** Immutable: a saved snapshot of a branch's draft. The migration adds a trigger refusing UPDATE/DELETE. */
export const versions = pgTable(
  'versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    studyId: uuid('study_id')
      .notNull()
      .references(() => studies.id, { onDelete: 'cascade' }),
    branchId: uuid('branch_id')
      .notNull()
      .references(() => branches.id, { onDelete: 'cascade' }),
    /** 1, 2, 3 … along its branch. */
    number: integer('number').notNull(),
    /** The version before this one: the previous on the branch, or the one the branch was made from. */
    parentVersionId: uuid('parent_version_id').references((): AnyPgColumn => versions.id),
    message: text('message').notNull(),
    authorId: uuid('author_id').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('versions_branch_number_key').on(t.branchId, t.number), index('versions_study_idx').on(t.studyId)],
);

/** Immutable: the ordered cells of a version, with the output each had when it was saved. */
export const versionCells = pgTable(
  'version_cells',
  {
    versionId: uuid('version_id')
      .notNull()
      .references(() => versions.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    cellId: uuid('cell_id')
      .notNull()
      .references(() => cells.id, { onDelete: 'cascade' }),
    cellRevisionId: uuid('cell_revision_id')
      .notNull()
      .references(() => cellRevisions.id),
    collapsed: integer('collapsed').notNull().default(0),
    outputKey: text('output_key'),
  },
  (t) => [primaryKey({ columns: [t.versionId, t.position] }), uniqueIndex('version_cells_version_cell_key').on(t.versionId, t.cellId)],
);

/**
 * Computed outputs, content-addressed: the key hashes the cell's inputs, the keys of the outputs it
 * depends on and the engine version, so running an unchanged cell again costs nothing.
 */
export const outputs = pgTable('outputs', {
  key: text('key').primaryKey(),
  kind: text('kind').notNull(),
  status: text('status').$type<'ok' | 'error'>().notNull(),
  /**
   * The result as the engine wrote it: json, not jsonb. Nothing queries inside it, and a run stores one
   * of tens of kB: jsonb would parse every number into its binary form on the way in (about half of
   * PostgreSQL's CPU per run in the notebook bench) and print it again on the way out.
   */
  result: json('result'),
  error: jsonb('error').$type<{ message: string; field?: string }>(),
  engineVersion: text('engine_version').notNull(),
  durationMs: integer('duration_ms').notNull().default(0),
  computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Uploaded pressure files, kept byte for byte with their hash. */
export const uploads = pgTable(
  'uploads',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    projectId: uuid('project_id')
      .notNull()
      .references(() => projects.id, { onDelete: 'cascade' }),
    studyId: uuid('study_id').references(() => studies.id, { onDelete: 'cascade' }),
    filename: text('filename').notNull(),
    contentType: text('content_type').notNull(),
    size: integer('size').notNull(),
    sha256: text('sha256').notNull(),
    content: bytea('content').notNull(),
    uploadedBy: uuid('uploaded_by').references(() => users.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('uploads_study_idx').on(t.studyId)],
);
