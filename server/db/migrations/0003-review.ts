import type { MigrationContext } from '../migrate'

/**
 * QA review: defect types, nonconformances with their parts and photos, and the lot's
 * submissions, decisions and reopenings. Decisions, submissions and reopenings are history:
 * the database refuses to change or delete them, like the audit trail.
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE defect_types (
      id serial PRIMARY KEY,
      code text NOT NULL UNIQUE,
      label text NOT NULL,
      active boolean NOT NULL DEFAULT true,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    -- "NC-2648-007": ISO year and week, then the week's sequence; numbered under the row lock.
    CREATE TABLE nc_number_counters (
      prefix text PRIMARY KEY,
      last_seq integer NOT NULL
    );

    CREATE TABLE nonconformances (
      id serial PRIMARY KEY,
      number text NOT NULL UNIQUE,
      lot_id integer NOT NULL REFERENCES lots(id),
      status text NOT NULL DEFAULT 'open' CHECK (status IN ('open','dispositioned','closed')),
      source text NOT NULL CHECK (source IN ('auto','manual')),
      criterion text CHECK (criterion IN ('surface-prep','climate','thickness','holiday','cure','adhesion')),
      defect_type_id integer NOT NULL REFERENCES defect_types(id),
      description text NOT NULL,
      disposition text CHECK (disposition IN ('repair-retest','strip-recoat','use-as-is','scrap')),
      concession_ref text,
      disposition_note text NOT NULL DEFAULT '',
      dispositioned_by integer REFERENCES users(id),
      dispositioned_at timestamptz,
      verification text,
      closed_by integer REFERENCES users(id),
      closed_at timestamptz,
      opened_by integer NOT NULL REFERENCES users(id),
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (source = 'manual' OR criterion IS NOT NULL),
      -- A part used as is ships only on the customer's written concession.
      CHECK (disposition IS DISTINCT FROM 'use-as-is' OR coalesce(concession_ref, '') <> ''),
      CHECK ((status = 'open') = (disposition IS NULL)),
      CHECK ((status = 'closed') = (closed_at IS NOT NULL AND verification IS NOT NULL))
    );
    CREATE INDEX nonconformances_lot ON nonconformances (lot_id, id);
    CREATE INDEX nonconformances_status ON nonconformances (status, created_at);

    CREATE TABLE nonconformance_parts (
      nonconformance_id integer NOT NULL REFERENCES nonconformances(id),
      part_id integer NOT NULL REFERENCES parts(id),
      -- The part's round when the nonconformance was opened, and the round its retest is recorded in.
      round_found integer NOT NULL,
      retest_round integer,
      PRIMARY KEY (nonconformance_id, part_id)
    );
    CREATE INDEX nonconformance_parts_part ON nonconformance_parts (part_id);

    ALTER TABLE photos ADD CONSTRAINT photos_nonconformance_fk
      FOREIGN KEY (nonconformance_id) REFERENCES nonconformances(id);
    CREATE INDEX photos_nonconformance ON photos (nonconformance_id) WHERE nonconformance_id IS NOT NULL;

    -- A scrapped part leaves the shipment: the certificate lists it apart, the release skips it.
    ALTER TABLE parts ADD COLUMN scrapped_by_nc integer REFERENCES nonconformances(id);

    CREATE TABLE lot_submissions (
      id serial PRIMARY KEY,
      lot_id integer NOT NULL REFERENCES lots(id),
      submitted_by integer NOT NULL REFERENCES users(id),
      submitted_at timestamptz NOT NULL DEFAULT clock_timestamp()
    );
    CREATE INDEX lot_submissions_lot ON lot_submissions (lot_id, submitted_at DESC);

    CREATE TABLE lot_decisions (
      id serial PRIMARY KEY,
      lot_id integer NOT NULL REFERENCES lots(id),
      decision text NOT NULL CHECK (decision IN ('release','hold','reject')),
      reason text NOT NULL DEFAULT '',
      from_status text NOT NULL,
      to_status text NOT NULL,
      lot_version integer NOT NULL,
      decided_by integer NOT NULL REFERENCES users(id),
      decided_at timestamptz NOT NULL DEFAULT clock_timestamp(),
      -- The plant let a person who recorded the lot's readings release it; the certificate says so.
      independence_waived boolean NOT NULL DEFAULT false,
      CHECK (decision = 'release' OR length(reason) >= 3)
    );
    CREATE INDEX lot_decisions_lot ON lot_decisions (lot_id, id);

    CREATE TABLE lot_reopenings (
      id serial PRIMARY KEY,
      lot_id integer NOT NULL REFERENCES lots(id),
      reason text NOT NULL CHECK (length(reason) >= 3),
      from_status text NOT NULL,
      reopened_by integer NOT NULL REFERENCES users(id),
      reopened_at timestamptz NOT NULL DEFAULT clock_timestamp()
    );
    CREATE INDEX lot_reopenings_lot ON lot_reopenings (lot_id, id);

    CREATE FUNCTION review_history_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION '% is append-only: % refused', TG_TABLE_NAME, TG_OP USING ERRCODE = 'insufficient_privilege';
    END $$;
    CREATE TRIGGER lot_decisions_append_only BEFORE UPDATE OR DELETE ON lot_decisions
      FOR EACH ROW EXECUTE FUNCTION review_history_refuse_change();
    CREATE TRIGGER lot_decisions_no_truncate BEFORE TRUNCATE ON lot_decisions
      FOR EACH STATEMENT EXECUTE FUNCTION review_history_refuse_change();
    CREATE TRIGGER lot_submissions_append_only BEFORE UPDATE OR DELETE ON lot_submissions
      FOR EACH ROW EXECUTE FUNCTION review_history_refuse_change();
    CREATE TRIGGER lot_reopenings_append_only BEFORE UPDATE OR DELETE ON lot_reopenings
      FOR EACH ROW EXECUTE FUNCTION review_history_refuse_change();
    CREATE TRIGGER lot_submissions_no_truncate BEFORE TRUNCATE ON lot_submissions
      FOR EACH STATEMENT EXECUTE FUNCTION review_history_refuse_change();
    CREATE TRIGGER lot_reopenings_no_truncate BEFORE TRUNCATE ON lot_reopenings
      FOR EACH STATEMENT EXECUTE FUNCTION review_history_refuse_change();
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE photos DROP CONSTRAINT photos_nonconformance_fk;
    DROP INDEX photos_nonconformance;
    ALTER TABLE parts DROP COLUMN scrapped_by_nc;
    DROP TABLE lot_reopenings, lot_decisions, lot_submissions, nonconformance_parts,
      nonconformances, nc_number_counters, defect_types;
    DROP FUNCTION review_history_refuse_change();
  `)
}
