import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Attachments, figures, measured data, and full-text search over entries. */
export class Files1796200000000 implements MigrationInterface {
  name = 'Files1796200000000';

  async up(q: QueryRunner): Promise<void> {
    // Attachments: files on an entry; the row is written after the object is stored.
    await q.query(`
      CREATE TABLE attachment (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        uploaded_by_id uuid NOT NULL REFERENCES app_user (id),
        storage_key text NOT NULL UNIQUE,
        original_name text NOT NULL,
        content_type text NOT NULL,
        byte_size integer NOT NULL CONSTRAINT attachment_size_check CHECK (byte_size >= 0),
        sha256 text NOT NULL CONSTRAINT attachment_sha256_check CHECK (sha256 ~ '^[0-9a-f]{64}$'),
        created_at timestamptz NOT NULL DEFAULT now(),
        removed_at timestamptz
      )`);
    // Listing an entry's files.
    await q.query(`CREATE INDEX attachment_entry_idx ON attachment (entry_id, created_at)`);

    // Figures: server-rendered plots of a revision's cell outputs.
    await q.query(`
      CREATE TABLE figure (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        revision_id uuid NOT NULL REFERENCES revision (id),
        cell_id uuid NOT NULL,
        cell_kind text NOT NULL,
        input_hash text NOT NULL,
        engine_version text NOT NULL,
        caption text NOT NULL DEFAULT '',
        spec jsonb NOT NULL,
        svg_key text NOT NULL,
        png_key text NOT NULL,
        svg_sha256 text NOT NULL,
        png_sha256 text NOT NULL,
        png_width integer NOT NULL,
        png_height integer NOT NULL,
        created_by_id uuid NOT NULL REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    // Listing an entry's figures; finding the figures of one computation.
    await q.query(`CREATE INDEX figure_entry_idx ON figure (entry_id, created_at)`);
    await q.query(`CREATE INDEX figure_input_hash_idx ON figure (input_hash)`);

    // Measured data sets imported from CSV.
    await q.query(`
      CREATE TABLE measurement_set (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        name text NOT NULL,
        parameter_name text NOT NULL,
        state_name text NOT NULL,
        rows jsonb NOT NULL,
        sha256 text NOT NULL,
        created_by_id uuid NOT NULL REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX measurement_set_entry_idx ON measurement_set (entry_id, created_at)`);

    // Full-text search: a vector kept by PostgreSQL from the entry's search text (title, tags and
    // the head revision's plain text, written when a revision is recorded), with a GIN index.
    await q.query(`ALTER TABLE entry ADD COLUMN search_vector tsvector GENERATED ALWAYS AS (to_tsvector('english', search_text)) STORED`);
    await q.query(`CREATE INDEX entry_search_vector_idx ON entry USING gin (search_vector)`);
  }

  async down(q: QueryRunner): Promise<void> {
    // Reverse order of up.
    await q.query(`DROP INDEX entry_search_vector_idx`);
    await q.query(`ALTER TABLE entry DROP COLUMN search_vector`);
    await q.query(`DROP TABLE measurement_set`);
    await q.query(`DROP TABLE figure`);
    await q.query(`DROP TABLE attachment`);
  }
}
