/**
 * Numbered forward migrations. `user_version` holds the number of the last one applied;
 * a database whose version is higher than the last migration here was written by a newer
 * Forelog and is refused rather than misread. Never edit a shipped migration: add one.
 */
export interface Migration {
  version: number;
  description: string;
  sql: string;
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
  // Number 3 belongs to the multiple-choice and numeric question types, which land from
  // their own line of work; 4 depends on nothing they add.
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
  // Number 5 belongs to the question types' line of work (as 3 does); 6 depends on nothing it adds.
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
];

export const SCHEMA_VERSION = MIGRATIONS[MIGRATIONS.length - 1]!.version;
