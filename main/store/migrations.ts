/**
 * Numbered forward migrations. `user_version` holds the number of the last one applied;
 * a database whose version is higher than the last migration here was written by a newer
 * Forelog and is refused rather than misread. Never edit a shipped migration: add one.
 */
export interface Migration {
  version: number;
  description: string;
  sql: string;
  /**
   * The migration rebuilds tables that others reference (SQLite's ALTER TABLE cannot
   * loosen a column's NOT NULL or CHECK): foreign keys are switched off around it, as
   * SQLite's documented procedure asks, so dropping the old table cascades to nothing;
   * every key is checked before it commits (main/store/open.ts migrate).
   */
  rebuildsTables?: boolean;
}

export const MIGRATIONS: readonly Migration[] = [
  {
    version: 1,
    description: 'questions, tags, forecast revisions with lenses, reference forecasts, resolutions, settings',
    sql: `
      CREATE TABLE questions (
        id             TEXT PRIMARY KEY,
        title          TEXT NOT NULL CHECK (length(trim(title)) > 0),
        rule           TEXT NOT NULL DEFAULT '',
        kind           TEXT NOT NULL CHECK (kind IN ('event_by_deadline', 'state_at_deadline')),
        opened_at      INTEGER NOT NULL,
        closes_at      INTEGER NOT NULL,
        time_zone      TEXT NOT NULL,
        base_rate      REAL CHECK (base_rate IS NULL OR (base_rate >= 0 AND base_rate <= 1)),
        base_rate_note TEXT NOT NULL DEFAULT '',
        false_alarm_cost REAL CHECK (false_alarm_cost IS NULL OR false_alarm_cost > 0),
        miss_cost      REAL CHECK (miss_cost IS NULL OR miss_cost > 0),
        checkin_days   INTEGER CHECK (checkin_days IS NULL OR checkin_days >= 0),
        created_at     INTEGER NOT NULL,
        updated_at     INTEGER NOT NULL,
        CHECK (closes_at > opened_at),
        CHECK ((false_alarm_cost IS NULL) = (miss_cost IS NULL))
      );
      CREATE INDEX questions_closes_at ON questions (closes_at);

      CREATE TABLE question_tags (
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        tag         TEXT NOT NULL,
        position    INTEGER NOT NULL,
        PRIMARY KEY (question_id, tag)
      );
      CREATE INDEX question_tags_tag ON question_tags (tag);

      -- seq is the entry order across the diary; it breaks ties between equal times.
      CREATE TABLE forecasts (
        seq         INTEGER PRIMARY KEY AUTOINCREMENT,
        id          TEXT NOT NULL UNIQUE,
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        at          INTEGER NOT NULL,
        p           REAL NOT NULL CHECK (p >= 0 AND p <= 1),
        note        TEXT NOT NULL DEFAULT ''
      );
      CREATE INDEX forecasts_question ON forecasts (question_id, at, seq);

      CREATE TABLE forecast_lenses (
        forecast_id TEXT NOT NULL REFERENCES forecasts (id) ON DELETE CASCADE,
        position    INTEGER NOT NULL,
        name        TEXT NOT NULL,
        p           REAL NOT NULL CHECK (p >= 0 AND p <= 1),
        weight      REAL NOT NULL CHECK (weight >= 0),
        PRIMARY KEY (forecast_id, position)
      );

      CREATE TABLE reference_forecasts (
        seq         INTEGER PRIMARY KEY AUTOINCREMENT,
        id          TEXT NOT NULL UNIQUE,
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        at          INTEGER NOT NULL,
        p           REAL NOT NULL CHECK (p >= 0 AND p <= 1),
        source      TEXT NOT NULL
      );
      CREATE INDEX reference_forecasts_question ON reference_forecasts (question_id, at, seq);

      CREATE TABLE resolutions (
        question_id TEXT PRIMARY KEY REFERENCES questions (id) ON DELETE CASCADE,
        outcome     TEXT NOT NULL CHECK (outcome IN ('yes', 'no', 'void')),
        at          INTEGER NOT NULL,
        note        TEXT NOT NULL DEFAULT '',
        recorded_at INTEGER NOT NULL
      );

      CREATE TABLE settings (
        key   TEXT PRIMARY KEY,
        value TEXT NOT NULL
      );
    `,
  },
  {
    version: 2,
    description: 'nudge delivery log and snoozes',
    sql: `
      CREATE TABLE nudge_log (
        key          TEXT PRIMARY KEY,
        question_id  TEXT,
        kind         TEXT NOT NULL,
        delivered_at INTEGER NOT NULL
      );
      CREATE INDEX nudge_log_question ON nudge_log (question_id);

      CREATE TABLE snoozes (
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        kind        TEXT NOT NULL CHECK (kind IN ('checkin', 'closing_soon', 'window_closed', 'overdue')),
        until       INTEGER NOT NULL,
        PRIMARY KEY (question_id, kind)
      );
    `,
  },
  // Number 3 was never shipped: the question types came after 4, as 5.
  {
    version: 4,
    description: 'resolution history (corrections and reopenings) and the undo log',
    sql: `
      -- Each earlier resolution of a question, kept when it is corrected or the question reopened.
      CREATE TABLE resolution_history (
        seq         INTEGER PRIMARY KEY AUTOINCREMENT,
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        outcome     TEXT NOT NULL,
        at          INTEGER NOT NULL,
        note        TEXT NOT NULL DEFAULT '',
        recorded_at INTEGER NOT NULL,
        replaced_at INTEGER NOT NULL,
        change      TEXT NOT NULL CHECK (change IN ('corrected', 'reopened')),
        change_note TEXT NOT NULL DEFAULT ''
      );
      CREATE INDEX resolution_history_question ON resolution_history (question_id, seq);

      -- What a change replaced, so the service can put it back (main/store/undo.ts). No
      -- foreign key on purpose: an entry must outlive the question it restores.
      CREATE TABLE undo_log (
        seq         INTEGER PRIMARY KEY AUTOINCREMENT,
        token       TEXT NOT NULL UNIQUE,
        question_id TEXT NOT NULL,
        operation   TEXT NOT NULL,
        recorded_at INTEGER NOT NULL,
        before      TEXT NOT NULL,
        -- the length of before, kept so the log can be bounded by size without reading it
        size        INTEGER NOT NULL,
        after_hash  TEXT NOT NULL
      );
      CREATE INDEX undo_log_recorded ON undo_log (recorded_at);
    `,
  },
  {
    version: 5,
    description: 'question types: multiple-choice options, numeric units and quantile levels, forecast vectors, option and value resolutions',
    rebuildsTables: true,
    sql: `
      -- A question's type, fixed when it is created (the trigger below); every existing question is yes/no.
      ALTER TABLE questions ADD COLUMN type TEXT NOT NULL DEFAULT 'binary' CHECK (type IN ('binary', 'choice', 'numeric'));
      -- Choice questions only: whether the options are ordered categories (0 or 1).
      ALTER TABLE questions ADD COLUMN ordered INTEGER CHECK (ordered IS NULL OR ordered IN (0, 1));
      -- Numeric questions only: the unit shown beside values ('' for none) and whether values are numbers or dates.
      ALTER TABLE questions ADD COLUMN unit TEXT;
      ALTER TABLE questions ADD COLUMN value_kind TEXT CHECK (value_kind IS NULL OR value_kind IN ('number', 'date'));
      CREATE TRIGGER questions_type_fixed BEFORE UPDATE OF type ON questions WHEN NEW.type IS NOT OLD.type
      BEGIN SELECT RAISE(ABORT, 'a question''s type is fixed when it is created'); END;
      CREATE TRIGGER questions_type_fields_insert BEFORE INSERT ON questions
      WHEN (NEW.type = 'choice') <> (NEW.ordered IS NOT NULL) OR (NEW.type = 'numeric') <> (NEW.unit IS NOT NULL AND NEW.value_kind IS NOT NULL)
        OR (NEW.type <> 'binary' AND (NEW.base_rate IS NOT NULL OR NEW.false_alarm_cost IS NOT NULL))
      BEGIN SELECT RAISE(ABORT, 'a question carries the fields of its own type only'); END;
      CREATE TRIGGER questions_type_fields_update BEFORE UPDATE ON questions
      WHEN (NEW.type = 'choice') <> (NEW.ordered IS NOT NULL) OR (NEW.type = 'numeric') <> (NEW.unit IS NOT NULL AND NEW.value_kind IS NOT NULL)
        OR (NEW.type <> 'binary' AND (NEW.base_rate IS NOT NULL OR NEW.false_alarm_cost IS NOT NULL))
      BEGIN SELECT RAISE(ABORT, 'a question carries the fields of its own type only'); END;

      -- A choice question's options in order, each with its stated base rate (all or none, summing to 1: the service checks).
      CREATE TABLE question_options (
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        position    INTEGER NOT NULL CHECK (position >= 0 AND position < 12),
        label       TEXT NOT NULL CHECK (length(trim(label)) > 0),
        base_rate   REAL CHECK (base_rate IS NULL OR (base_rate >= 0 AND base_rate <= 1)),
        PRIMARY KEY (question_id, position),
        UNIQUE (question_id, label)
      );

      -- A numeric question's quantile levels, ascending (shared/quantile-levels.ts).
      CREATE TABLE question_levels (
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        position    INTEGER NOT NULL CHECK (position >= 0 AND position < 7),
        level       REAL NOT NULL CHECK (level IN (0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95)),
        PRIMARY KEY (question_id, position)
      );

      -- Revisions and reference forecasts of choice and numeric questions have no single p:
      -- both tables are rebuilt with p nullable, every row and the entry-order counter kept.
      CREATE TABLE forecasts_v5 (
        seq         INTEGER PRIMARY KEY AUTOINCREMENT,
        id          TEXT NOT NULL UNIQUE,
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        at          INTEGER NOT NULL,
        p           REAL CHECK (p IS NULL OR (p >= 0 AND p <= 1)),
        note        TEXT NOT NULL DEFAULT ''
      );
      INSERT INTO forecasts_v5 (seq, id, question_id, at, p, note) SELECT seq, id, question_id, at, p, note FROM forecasts;
      DELETE FROM sqlite_sequence WHERE name = 'forecasts_v5';
      INSERT INTO sqlite_sequence (name, seq) SELECT 'forecasts_v5', seq FROM sqlite_sequence WHERE name = 'forecasts';
      DROP TABLE forecasts;
      ALTER TABLE forecasts_v5 RENAME TO forecasts;
      CREATE INDEX forecasts_question ON forecasts (question_id, at, seq);

      CREATE TABLE reference_forecasts_v5 (
        seq         INTEGER PRIMARY KEY AUTOINCREMENT,
        id          TEXT NOT NULL UNIQUE,
        question_id TEXT NOT NULL REFERENCES questions (id) ON DELETE CASCADE,
        at          INTEGER NOT NULL,
        p           REAL CHECK (p IS NULL OR (p >= 0 AND p <= 1)),
        source      TEXT NOT NULL
      );
      INSERT INTO reference_forecasts_v5 (seq, id, question_id, at, p, source) SELECT seq, id, question_id, at, p, source FROM reference_forecasts;
      DELETE FROM sqlite_sequence WHERE name = 'reference_forecasts_v5';
      INSERT INTO sqlite_sequence (name, seq) SELECT 'reference_forecasts_v5', seq FROM sqlite_sequence WHERE name = 'reference_forecasts';
      DROP TABLE reference_forecasts;
      ALTER TABLE reference_forecasts_v5 RENAME TO reference_forecasts;
      CREATE INDEX reference_forecasts_question ON reference_forecasts (question_id, at, seq);

      -- A choice revision's probabilities (one per option) or a numeric revision's quantiles
      -- (one per level; dates as days since 1970-01-01), in order; as numbers, bit for bit.
      -- WITHOUT ROWID: each revision's values sit together in key order, so the scoring
      -- reader finds them with no lookup per value.
      CREATE TABLE forecast_values (
        forecast_id TEXT NOT NULL REFERENCES forecasts (id) ON DELETE CASCADE,
        position    INTEGER NOT NULL CHECK (position >= 0),
        value       REAL NOT NULL,
        PRIMARY KEY (forecast_id, position)
      ) WITHOUT ROWID;
      CREATE TABLE reference_values (
        reference_id TEXT NOT NULL REFERENCES reference_forecasts (id) ON DELETE CASCADE,
        position     INTEGER NOT NULL CHECK (position >= 0),
        value        REAL NOT NULL,
        PRIMARY KEY (reference_id, position)
      ) WITHOUT ROWID;

      -- Resolutions gain the option that came true (choice) and the value taken (numeric; dates as days).
      CREATE TABLE resolutions_v5 (
        question_id TEXT PRIMARY KEY REFERENCES questions (id) ON DELETE CASCADE,
        outcome     TEXT NOT NULL CHECK (outcome IN ('yes', 'no', 'void', 'option', 'value')),
        at          INTEGER NOT NULL,
        note        TEXT NOT NULL DEFAULT '',
        recorded_at INTEGER NOT NULL,
        option      INTEGER CHECK (option IS NULL OR option >= 0),
        value       REAL,
        CHECK ((outcome = 'option') = (option IS NOT NULL)),
        CHECK ((outcome = 'value') = (value IS NOT NULL))
      );
      INSERT INTO resolutions_v5 (question_id, outcome, at, note, recorded_at) SELECT question_id, outcome, at, note, recorded_at FROM resolutions;
      DROP TABLE resolutions;
      ALTER TABLE resolutions_v5 RENAME TO resolutions;

      ALTER TABLE resolution_history ADD COLUMN option INTEGER;
      ALTER TABLE resolution_history ADD COLUMN value REAL;
    `,
  },
  {
    version: 6,
    description: "each question's revisions indexed with their probability, so reading them for scoring and the due list needs no row lookups",
    sql: `
      -- The same order as before (question, then time, then entry order) with p beside it:
      -- the scoring reader and the due list's latest revision read the index alone.
      DROP INDEX forecasts_question;
      CREATE INDEX forecasts_question ON forecasts (question_id, at, seq, p);
    `,
  },
  {
    version: 7,
    description: 'the revisions that carry a note, indexed apart, so a search of the notes and the export read only those',
    sql: `
      -- Partial: only revisions with a note are in it, so revisions without one (most of a
      -- large diary) cost nothing to write or to skip. The question list's search of the notes
      -- and the export's pass for noted revisions read this index instead of every revision row.
      CREATE INDEX forecasts_noted ON forecasts (question_id, note) WHERE note <> '';
    `,
  },
  {
    version: 8,
    description: 'the unresolved questions kept apart by triggers, each with its latest revision, so the due list and the top-bar count read only them',
    sql: `
      -- Derived data, never written by the app: for every question with no resolution, a
      -- copy of the fields nudge planning reads and its latest revision (latest time; same
      -- time: entered last, the highest seq). A large diary is mostly resolved questions;
      -- finding the open ones by probing the resolutions for each question, fetching its row
      -- from pages spread over the whole table, then seeking its latest revision in the
      -- revisions index, was nearly all of the due list's reading. This table holds just the
      -- answer, side by side. The triggers below keep it exact whatever writes the diary (the
      -- service, undo, a restore, another program), in any order of rows within a transaction
      -- (foreign keys may be deferred, so a revision may arrive before its question) — with
      -- one exception: INSERT OR REPLACE into \`forecasts\` (never the app's) removes the row
      -- it replaces without firing the delete trigger (SQLite fires none for REPLACE unless
      -- recursive_triggers is on), so a latest revision replaced that way can stay here
      -- after it is gone. Watching for it costs every revision insert an
      -- extra lookup (an import about 13 % more time), so it is not done. It has
      -- no foreign key on purpose: it is not a question's own data, so undo's snapshots leave
      -- it out and the triggers rebuild it. A migration that rebuilds \`questions\`,
      -- \`resolutions\` or \`forecasts\` must create these triggers again.
      CREATE TABLE unresolved_questions (
        id           TEXT PRIMARY KEY,
        title        TEXT NOT NULL,
        kind         TEXT NOT NULL,
        type         TEXT NOT NULL,
        opened_at    INTEGER NOT NULL,
        closes_at    INTEGER NOT NULL,
        time_zone    TEXT NOT NULL,
        checkin_days INTEGER,
        last_at      INTEGER,
        last_seq     INTEGER,
        last_p       REAL
      ) WITHOUT ROWID;
      -- What the table must hold, computed from the tables themselves: the one statement of
      -- the rule. A trigger brings a question up to date by deleting its row and inserting
      -- what this view gives for it (nothing when it is resolved or gone), in the table's
      -- column order.
      CREATE VIEW unresolved_questions_computed AS
        SELECT q.id, q.title, q.kind, q.type, q.opened_at, q.closes_at, q.time_zone, q.checkin_days,
          (SELECT at FROM forecasts WHERE question_id = q.id ORDER BY at DESC, seq DESC LIMIT 1) AS last_at,
          (SELECT seq FROM forecasts WHERE question_id = q.id ORDER BY at DESC, seq DESC LIMIT 1) AS last_seq,
          (SELECT p FROM forecasts WHERE question_id = q.id ORDER BY at DESC, seq DESC LIMIT 1) AS last_p
        FROM questions q
        WHERE NOT EXISTS (SELECT 1 FROM resolutions WHERE question_id = q.id);
      INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed;

      CREATE TRIGGER unresolved_question_added AFTER INSERT ON questions
      BEGIN
        DELETE FROM unresolved_questions WHERE id = NEW.id;
        INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed WHERE id = NEW.id;
      END;
      -- Under another id too (the app never renames; another program may, with foreign keys
      -- deferred, moving the revisions and resolution before or after, or deleting them).
      CREATE TRIGGER unresolved_question_changed AFTER UPDATE OF id, title, kind, opened_at, closes_at, time_zone, checkin_days ON questions
      BEGIN
        DELETE FROM unresolved_questions WHERE id IN (OLD.id, NEW.id);
        INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed WHERE id IN (OLD.id, NEW.id);
      END;
      CREATE TRIGGER unresolved_question_removed AFTER DELETE ON questions
      BEGIN
        DELETE FROM unresolved_questions WHERE id = OLD.id;
      END;
      CREATE TRIGGER unresolved_question_resolved AFTER INSERT ON resolutions
      BEGIN
        DELETE FROM unresolved_questions WHERE id = NEW.question_id;
      END;
      CREATE TRIGGER unresolved_question_reopened AFTER DELETE ON resolutions
      BEGIN
        DELETE FROM unresolved_questions WHERE id = OLD.question_id;
        INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed WHERE id = OLD.question_id;
      END;
      -- A resolution moved to another question (the app never does; another program may).
      CREATE TRIGGER unresolved_resolution_moved AFTER UPDATE OF question_id ON resolutions
      BEGIN
        DELETE FROM unresolved_questions WHERE id IN (OLD.question_id, NEW.question_id);
        INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed WHERE id IN (OLD.question_id, NEW.question_id);
      END;
      -- The hot path (an import writes millions of revisions): a new revision is the latest
      -- when it is later, or as late and entered after (seq only grows), so the row is
      -- updated in place rather than computed again.
      CREATE TRIGGER unresolved_revision_added AFTER INSERT ON forecasts
      BEGIN
        UPDATE unresolved_questions SET last_at = NEW.at, last_seq = NEW.seq, last_p = NEW.p
        WHERE id = NEW.question_id AND (last_at IS NULL OR NEW.at > last_at OR (NEW.at = last_at AND NEW.seq > last_seq));
      END;
      CREATE TRIGGER unresolved_revision_changed AFTER UPDATE OF question_id, at, seq, p ON forecasts
      BEGIN
        DELETE FROM unresolved_questions WHERE id IN (OLD.question_id, NEW.question_id);
        INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed WHERE id IN (OLD.question_id, NEW.question_id);
      END;
      -- Only the latest revision's removal changes anything (a question's deletion removes
      -- every revision; the others cost a lookup).
      CREATE TRIGGER unresolved_revision_removed AFTER DELETE ON forecasts
      WHEN OLD.seq IS (SELECT last_seq FROM unresolved_questions WHERE id = OLD.question_id)
      BEGIN
        DELETE FROM unresolved_questions WHERE id = OLD.question_id;
        INSERT INTO unresolved_questions SELECT * FROM unresolved_questions_computed WHERE id = OLD.question_id;
      END;
    `,
  },
];

/**
 * Tables the schema's own triggers fill from the others (migration 8): copying one from
 * another diary would clash with what the triggers already put there, so a restore copies
 * the other tables and lets the triggers rebuild these.
 */
export const DERIVED_TABLES: ReadonlySet<string> = new Set(['unresolved_questions']);

export const SCHEMA_VERSION = MIGRATIONS[MIGRATIONS.length - 1]!.version;
