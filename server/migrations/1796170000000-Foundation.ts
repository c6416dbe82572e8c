import type { MigrationInterface, QueryRunner } from 'typeorm';

/** People, sessions, notebooks, memberships, invites, password resets and the audit trail. */
export class Foundation1796170000000 implements MigrationInterface {
  name = 'Foundation1796170000000';

  async up(q: QueryRunner): Promise<void> {
    // gen_random_uuid() for primary keys and digest() are built in / in pgcrypto.
    await q.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);

    // People. E-mail is stored lower-case and is unique; only an argon2id hash of the password is kept.
    await q.query(`
      CREATE TABLE app_user (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL CONSTRAINT app_user_email_unique UNIQUE,
        name text NOT NULL,
        password_hash text NOT NULL,
        site_role text NOT NULL DEFAULT 'member' CONSTRAINT app_user_site_role_check CHECK (site_role IN ('administrator', 'member')),
        active boolean NOT NULL DEFAULT true,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);

    // Sessions, in the layout connect-pg-simple reads and writes.
    await q.query(`
      CREATE TABLE session (
        sid varchar NOT NULL COLLATE "default" PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      )`);
    // Expired sessions are pruned by expiry time.
    await q.query(`CREATE INDEX session_expire_idx ON session (expire)`);

    // Notebooks: one study's shared log.
    await q.query(`
      CREATE TABLE notebook (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        title text NOT NULL,
        description text NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);

    // A person's role in a notebook; one membership per person and notebook.
    await q.query(`
      CREATE TABLE membership (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        role text NOT NULL CONSTRAINT membership_role_check CHECK (role IN ('pi', 'researcher', 'reader')),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT membership_notebook_user_unique UNIQUE (notebook_id, user_id)
      )`);
    // "My notebooks" looks memberships up by person.
    await q.query(`CREATE INDEX membership_user_idx ON membership (user_id)`);

    // Invitations by e-mail; the link token is stored only as its SHA-256.
    await q.query(`
      CREATE TABLE invite (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email text NOT NULL,
        name text NOT NULL,
        site_role text NOT NULL CONSTRAINT invite_site_role_check CHECK (site_role IN ('administrator', 'member')),
        token_hash text NOT NULL CONSTRAINT invite_token_hash_unique UNIQUE,
        invited_by_id uuid NOT NULL REFERENCES app_user (id),
        expires_at timestamptz NOT NULL,
        accepted_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);

    // Password-reset links; token stored only as its SHA-256.
    await q.query(`
      CREATE TABLE password_reset (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
        token_hash text NOT NULL CONSTRAINT password_reset_token_hash_unique UNIQUE,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);

    // The audit trail: append-only, each row hash-chained to the one before.
    await q.query(`
      CREATE TABLE audit_event (
        seq bigserial PRIMARY KEY,
        occurred_at timestamptz NOT NULL,
        actor_id uuid,
        action text NOT NULL,
        entity_type text NOT NULL,
        entity_id text,
        notebook_id uuid,
        summary jsonb NOT NULL DEFAULT '{}'::jsonb,
        prev_hash text NOT NULL,
        hash text NOT NULL
      )`);
    // A notebook's history is read by notebook.
    await q.query(`CREATE INDEX audit_event_notebook_idx ON audit_event (notebook_id, seq)`);

    // Refuse any change to written audit rows.
    await q.query(`
      CREATE FUNCTION audit_event_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'audit_event is append-only: % refused', TG_OP USING ERRCODE = 'insufficient_privilege';
      END
      $$`);
    // Row-level: UPDATE and DELETE.
    await q.query(`
      CREATE TRIGGER audit_event_append_only BEFORE UPDATE OR DELETE ON audit_event
      FOR EACH ROW EXECUTE FUNCTION audit_event_refuse_change()`);
    // Statement-level: TRUNCATE.
    await q.query(`
      CREATE TRIGGER audit_event_no_truncate BEFORE TRUNCATE ON audit_event
      FOR EACH STATEMENT EXECUTE FUNCTION audit_event_refuse_change()`);
  }

  async down(q: QueryRunner): Promise<void> {
    // Reverse order of creation.
    await q.query(`DROP TABLE audit_event`);
    await q.query(`DROP FUNCTION audit_event_refuse_change()`);
    await q.query(`DROP TABLE password_reset`);
    await q.query(`DROP TABLE invite`);
    await q.query(`DROP TABLE membership`);
    await q.query(`DROP TABLE notebook`);
    await q.query(`DROP TABLE session`);
    await q.query(`DROP TABLE app_user`);
  }
}
