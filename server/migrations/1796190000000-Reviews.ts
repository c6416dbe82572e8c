import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Reviews, electronic signatures, comments, the mail outbox and notification preferences. */
export class Reviews1796190000000 implements MigrationInterface {
  name = 'Reviews1796190000000';

  async up(q: QueryRunner): Promise<void> {
    // Reviews: a request that the notebook's PIs look at an entry; follows the newest revision while open.
    await q.query(`
      CREATE TABLE review (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        requested_by_id uuid NOT NULL REFERENCES app_user (id),
        note text NOT NULL DEFAULT '',
        status text NOT NULL DEFAULT 'open'
          CONSTRAINT review_status_check CHECK (status IN ('open', 'changes-requested', 'approved')),
        revision_id uuid NOT NULL REFERENCES revision (id),
        submitted_revision_id uuid NOT NULL REFERENCES revision (id),
        last_seen jsonb NOT NULL DEFAULT '{}'::jsonb,
        decided_by_id uuid REFERENCES app_user (id),
        closed_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    // One open review per entry.
    await q.query(`CREATE UNIQUE INDEX review_one_open_per_entry ON review (entry_id) WHERE status = 'open'`);
    // The queue lists open reviews by notebook.
    await q.query(`CREATE INDEX review_notebook_status_idx ON review (notebook_id, status)`);

    // A revision's (id, content_hash) pair is unique (id alone is), so signatures can reference the pair.
    await q.query(`ALTER TABLE revision ADD CONSTRAINT revision_id_content_hash_unique UNIQUE (id, content_hash)`);

    // Signatures: bound to the revision and its content hash by one composite foreign key, so a
    // signature row cannot name a revision whose content differs from what was signed.
    await q.query(`
      CREATE TABLE signature (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        revision_id uuid NOT NULL,
        content_hash text NOT NULL,
        review_id uuid REFERENCES review (id),
        signer_id uuid NOT NULL REFERENCES app_user (id),
        printed_name text NOT NULL CONSTRAINT signature_printed_name_present CHECK (length(printed_name) > 0),
        meaning text NOT NULL CONSTRAINT signature_meaning_check CHECK (meaning IN ('approved')),
        signed_at timestamptz NOT NULL,
        reproducibility jsonb NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT signature_revision_content_fk FOREIGN KEY (revision_id, content_hash)
          REFERENCES revision (id, content_hash),
        CONSTRAINT signature_once_per_signer UNIQUE (revision_id, signer_id, meaning)
      )`);
    await q.query(`CREATE INDEX signature_revision_idx ON signature (revision_id)`);
    // Signatures are permanent: refuse UPDATE and DELETE.
    await q.query(`
      CREATE FUNCTION signature_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'signatures are permanent: % refused', TG_OP USING ERRCODE = 'insufficient_privilege';
      END
      $$`);
    // Row-level, before the change is made.
    await q.query(`
      CREATE TRIGGER signature_permanent BEFORE UPDATE OR DELETE ON signature
      FOR EACH ROW EXECUTE FUNCTION signature_refuse_change()`);

    // Comments: anchored to a revision (and optionally a block or cell), threaded by parent_id.
    await q.query(`
      CREATE TABLE comment (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        parent_id uuid REFERENCES comment (id),
        revision_id uuid NOT NULL REFERENCES revision (id),
        block_index integer CONSTRAINT comment_block_index_check CHECK (block_index >= 0),
        cell_id text,
        kind text NOT NULL DEFAULT 'comment' CONSTRAINT comment_kind_check CHECK (kind IN ('comment', 'changes-requested')),
        body text NOT NULL,
        author_id uuid NOT NULL REFERENCES app_user (id),
        mention_ids uuid[] NOT NULL DEFAULT '{}',
        resolved_at timestamptz,
        resolved_by_id uuid REFERENCES app_user (id),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    // Comments are listed per entry in time order.
    await q.query(`CREATE INDEX comment_entry_idx ON comment (entry_id, created_at)`);

    // The mail outbox: written in the change's transaction, sent by the background worker.
    await q.query(`
      CREATE TABLE mail_message (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        to_address text NOT NULL,
        subject text NOT NULL,
        text text NOT NULL,
        html text NOT NULL,
        kind text NOT NULL,
        status text NOT NULL DEFAULT 'pending' CONSTRAINT mail_message_status_check CHECK (status IN ('pending', 'sent', 'failed')),
        attempts integer NOT NULL DEFAULT 0,
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        last_error text,
        sent_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    // The worker picks due pending messages.
    await q.query(`CREATE INDEX mail_message_due_idx ON mail_message (next_attempt_at) WHERE status = 'pending'`);

    // Which kinds of mail a person has turned off (or back on); no row means on.
    await q.query(`
      CREATE TABLE notification_preference (
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        kind text NOT NULL,
        enabled boolean NOT NULL,
        updated_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (user_id, kind)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    // Reverse order of creation.
    await q.query(`DROP TABLE notification_preference`);
    await q.query(`DROP TABLE mail_message`);
    await q.query(`DROP TABLE comment`);
    await q.query(`DROP TABLE signature`);
    await q.query(`DROP FUNCTION signature_refuse_change()`);
    await q.query(`ALTER TABLE revision DROP CONSTRAINT revision_id_content_hash_unique`);
    await q.query(`DROP TABLE review`);
  }
}
