import type { MigrationContext } from '../migrate'

/**
 * Certificates of conformance and the mail outbox that carries them to the customer.
 *
 * A certificate is evidence: its PDF bytes, fingerprints, number, data and verification code are
 * written once at issue and the database refuses to change them or delete the row. Only its
 * life-cycle columns move (valid → superseded | revoked, needs_reissue) — and only forwards.
 *
 * mail_outbox: one row per recipient, inserted in the issuing transaction. Workers claim due rows
 * with FOR UPDATE SKIP LOCKED and a lease (locked_until), so two server processes on one
 * database never pick the same message (server/mail/outboxWorker.ts).
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    -- "HFW-C-26-00042": plant initials, calendar year, the year's sequence; numbered under the row lock.
    CREATE TABLE certificate_number_counters (
      prefix text PRIMARY KEY,
      last_seq integer NOT NULL
    );

    CREATE TABLE certificates (
      id serial PRIMARY KEY,
      number text NOT NULL UNIQUE,
      kind text NOT NULL CHECK (kind IN ('2.1','2.2','3.1')),
      lot_id integer NOT NULL REFERENCES lots(id),
      customer_id integer NOT NULL REFERENCES customers(id),
      -- Random (16 bytes, base64url), never the id: the public verification page's key.
      verify_code text NOT NULL UNIQUE CHECK (verify_code ~ '^[A-Za-z0-9_-]{22,}$'),
      state text NOT NULL DEFAULT 'valid' CHECK (state IN ('valid','superseded','revoked')),
      data jsonb NOT NULL,
      pdf bytea NOT NULL,
      pdf_sha256 text NOT NULL CHECK (pdf_sha256 ~ '^[0-9a-f]{64}$'),
      content_sha256 text NOT NULL CHECK (content_sha256 ~ '^[0-9a-f]{64}$'),
      issued_by integer NOT NULL REFERENCES users(id),
      issued_at timestamptz NOT NULL,
      supersedes_id integer UNIQUE REFERENCES certificates(id),
      reissue_reason text,
      -- Deferred: a reissue marks the old certificate superseded by the new id before inserting
      -- the new row, so the lot never has two valid certificates, not even inside the transaction.
      superseded_by_id integer UNIQUE REFERENCES certificates(id) DEFERRABLE INITIALLY DEFERRED,
      superseded_at timestamptz,
      revoked_at timestamptz,
      revoked_by integer REFERENCES users(id),
      revoke_reason text,
      -- Set when the lot is reopened after release (server/api/review/certificatesHook.ts).
      needs_reissue boolean NOT NULL DEFAULT false,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((state = 'revoked') = (revoked_at IS NOT NULL AND length(coalesce(revoke_reason, '')) >= 3)),
      CHECK ((state = 'superseded') = (superseded_by_id IS NOT NULL)),
      CHECK (supersedes_id IS NULL OR length(coalesce(reissue_reason, '')) >= 3)
    );
    -- A lot has at most one valid certificate: a second one is a reissue.
    CREATE UNIQUE INDEX certificates_one_valid_per_lot ON certificates (lot_id) WHERE state = 'valid';
    CREATE INDEX certificates_customer ON certificates (customer_id, issued_at DESC);
    CREATE INDEX certificates_issued ON certificates (issued_at DESC);

    CREATE FUNCTION certificates_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'certificates are never deleted: revoke with a reason instead'
          USING ERRCODE = 'insufficient_privilege';
      END IF;
      IF (NEW.number, NEW.kind, NEW.lot_id, NEW.customer_id, NEW.verify_code, NEW.data, NEW.pdf,
          NEW.pdf_sha256, NEW.content_sha256, NEW.issued_by, NEW.issued_at, NEW.supersedes_id,
          NEW.reissue_reason)
         IS DISTINCT FROM
         (OLD.number, OLD.kind, OLD.lot_id, OLD.customer_id, OLD.verify_code, OLD.data, OLD.pdf,
          OLD.pdf_sha256, OLD.content_sha256, OLD.issued_by, OLD.issued_at, OLD.supersedes_id,
          OLD.reissue_reason)
         OR (OLD.state <> 'valid' AND NEW.state IS DISTINCT FROM OLD.state)
         OR (OLD.needs_reissue AND NOT NEW.needs_reissue) THEN
        RAISE EXCEPTION 'an issued certificate is evidence: only its state may move on (valid → superseded or revoked)'
          USING ERRCODE = 'insufficient_privilege';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER certificates_evidence BEFORE UPDATE OR DELETE ON certificates
      FOR EACH ROW EXECUTE FUNCTION certificates_guard();

    CREATE TABLE mail_outbox (
      id bigserial PRIMARY KEY,
      certificate_id integer NOT NULL REFERENCES certificates(id),
      contact_id integer REFERENCES customer_contacts(id),
      recipient_name text NOT NULL,
      recipient_email text NOT NULL,
      subject text NOT NULL,
      body_text text NOT NULL,
      -- queued: waiting (again, after a failed attempt); sending: claimed under a lease;
      -- sent; failed: gave up after the maximum attempts (resend queues it again).
      status text NOT NULL DEFAULT 'queued' CHECK (status IN ('queued','sending','sent','failed')),
      attempts integer NOT NULL DEFAULT 0,
      next_attempt_at timestamptz NOT NULL DEFAULT now(),
      locked_until timestamptz,
      locked_by text,
      last_error text,
      last_attempt_at timestamptz,
      sent_at timestamptz,
      message_id text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((status = 'sending') = (locked_until IS NOT NULL)),
      CHECK ((status = 'sent') = (sent_at IS NOT NULL))
    );
    CREATE INDEX mail_outbox_due ON mail_outbox (next_attempt_at, id) WHERE status IN ('queued','sending');
    CREATE INDEX mail_outbox_certificate ON mail_outbox (certificate_id, id);
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TABLE mail_outbox, certificates, certificate_number_counters;
    DROP FUNCTION certificates_guard();
  `)
}
