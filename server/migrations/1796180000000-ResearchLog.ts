import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Research-log entries, their immutable revisions, per-person drafts and stored analysis results. */
export class ResearchLog1796180000000 implements MigrationInterface {
  name = 'ResearchLog1796180000000';

  async up(q: QueryRunner): Promise<void> {
    // Entries: one dated log item of a notebook; the list columns mirror the head revision.
    await q.query(`
      CREATE TABLE entry (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        author_id uuid NOT NULL REFERENCES app_user (id),
        title text NOT NULL,
        entry_date date NOT NULL,
        tags text[] NOT NULL DEFAULT '{}',
        status text NOT NULL DEFAULT 'draft'
          CONSTRAINT entry_status_check CHECK (status IN ('draft', 'in-review', 'approved', 'changes-requested')),
        head_revision_id uuid,
        revision_count integer NOT NULL DEFAULT 0,
        search_text text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    // The log page lists a notebook's entries newest first.
    await q.query(`CREATE INDEX entry_notebook_date_idx ON entry (notebook_id, entry_date DESC, created_at DESC)`);

    // Revisions: every save of an entry, numbered 1, 2, 3 … per entry, each pointing at its parent.
    await q.query(`
      CREATE TABLE revision (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        number integer NOT NULL CONSTRAINT revision_number_positive CHECK (number >= 1),
        parent_id uuid REFERENCES revision (id),
        restored_from_id uuid REFERENCES revision (id),
        title text NOT NULL,
        entry_date date NOT NULL,
        tags text[] NOT NULL,
        document jsonb NOT NULL,
        outputs jsonb NOT NULL DEFAULT '{}'::jsonb,
        message text,
        author_id uuid NOT NULL REFERENCES app_user (id),
        content_hash text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT revision_entry_number_unique UNIQUE (entry_id, number)
      )`);

    // The entry's head must be one of its revisions (set in the same transaction that creates both).
    await q.query(`
      ALTER TABLE entry ADD CONSTRAINT entry_head_revision_fk
        FOREIGN KEY (head_revision_id) REFERENCES revision (id) DEFERRABLE INITIALLY DEFERRED`);

    // Revisions are immutable: refuse every UPDATE.
    await q.query(`
      CREATE FUNCTION revision_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'revisions are immutable: UPDATE refused' USING ERRCODE = 'insufficient_privilege';
      END
      $$`);
    // Row-level, before the change is made.
    await q.query(`
      CREATE TRIGGER revision_immutable BEFORE UPDATE ON revision
      FOR EACH ROW EXECUTE FUNCTION revision_refuse_update()`);

    // Working drafts: one per person and entry.
    await q.query(`
      CREATE TABLE entry_draft (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        base_revision_id uuid NOT NULL REFERENCES revision (id),
        title text NOT NULL,
        entry_date date NOT NULL,
        tags text[] NOT NULL,
        document jsonb NOT NULL,
        outputs jsonb NOT NULL DEFAULT '{}'::jsonb,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT entry_draft_entry_user_unique UNIQUE (entry_id, user_id)
      )`);

    // Finished engine runs by input hash (engine version + model + task).
    await q.query(`
      CREATE TABLE analysis_result (
        input_hash text PRIMARY KEY,
        engine_version text NOT NULL,
        task_kind text NOT NULL,
        result jsonb NOT NULL,
        elapsed_ms double precision NOT NULL,
        computed_at timestamptz NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    // Reverse order of creation.
    await q.query(`DROP TABLE analysis_result`);
    await q.query(`DROP TABLE entry_draft`);
    await q.query(`ALTER TABLE entry DROP CONSTRAINT entry_head_revision_fk`);
    await q.query(`DROP TABLE revision`);
    await q.query(`DROP FUNCTION revision_refuse_update()`);
    await q.query(`DROP TABLE entry`);
  }
}
