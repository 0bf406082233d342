import type { MigrationContext } from '../migrate'

/**
 * The shop floor: lots, parts, section records, gauge readings, shift verifications, photos.
 * Thickness values are double precision: the tablet's JS numbers are stored bit for bit, so the
 * verdict computed from stored rows equals the one the tablet computed live.
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    -- Search by partial lot, order, part or heat number (ILIKE '%...%') uses trigram indexes.
    CREATE EXTENSION IF NOT EXISTS pg_trgm;

    -- One row per line letter + ISO week ("F2648"); incremented under its row lock, so two lots
    -- opened at the same moment never get the same number.
    CREATE TABLE lot_number_counters (
      prefix text PRIMARY KEY,
      last_seq integer NOT NULL
    );

    CREATE TABLE lots (
      id serial PRIMARY KEY,
      lot_number text NOT NULL UNIQUE,
      customer_id integer NOT NULL REFERENCES customers(id),
      order_ref text NOT NULL,
      spec_id integer NOT NULL REFERENCES coating_specs(id),
      spec_version integer NOT NULL,
      line text NOT NULL CHECK (line IN ('fbe-powder','liquid-epoxy')),
      shift text NOT NULL CHECK (shift IN ('1','2','3')),
      coating_material text NOT NULL,
      batch_number text NOT NULL,
      batch_expires_on date NOT NULL,
      status text NOT NULL DEFAULT 'open'
        CHECK (status IN ('open','awaiting-review','on-hold','released','rejected')),
      notes text NOT NULL DEFAULT '',
      opened_by integer NOT NULL REFERENCES users(id),
      client_id uuid NOT NULL UNIQUE,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      FOREIGN KEY (spec_id, spec_version) REFERENCES spec_versions(spec_id, version)
    );
    CREATE INDEX lots_status_created ON lots (status, created_at DESC);
    CREATE INDEX lots_created ON lots (created_at DESC);
    CREATE INDEX lots_customer ON lots (customer_id, created_at DESC);
    CREATE INDEX lots_spec ON lots (spec_id, spec_version);
    CREATE INDEX lots_lot_number_trgm ON lots USING gin (lot_number gin_trgm_ops);
    CREATE INDEX lots_order_ref_trgm ON lots USING gin (order_ref gin_trgm_ops);

    CREATE TABLE parts (
      id serial PRIMARY KEY,
      lot_id integer NOT NULL REFERENCES lots(id),
      part_number text NOT NULL,
      description text NOT NULL DEFAULT '',
      heat_number text NOT NULL DEFAULT '',
      quantity integer NOT NULL DEFAULT 1 CHECK (quantity >= 1),
      coated_area_m2 double precision CHECK (coated_area_m2 IS NULL OR coated_area_m2 > 0),
      sampled boolean NOT NULL DEFAULT true,
      round integer NOT NULL DEFAULT 1 CHECK (round >= 1),
      verdict jsonb,
      verdict_status text CHECK (verdict_status IN ('pass','fail','incomplete')),
      -- The verdict at the end of round 1, kept for first-pass yield after repairs open round 2.
      first_pass_status text CHECK (first_pass_status IN ('pass','fail','incomplete')),
      thickness_mean_um double precision,
      client_id uuid NOT NULL UNIQUE,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX parts_lot ON parts (lot_id, id);
    CREATE INDEX parts_part_number_trgm ON parts USING gin (part_number gin_trgm_ops);
    CREATE INDEX parts_heat_number_trgm ON parts USING gin (heat_number gin_trgm_ops);

    -- Append-only: a correction is a new record; the latest per (part, round, section) is current.
    CREATE TABLE section_records (
      id serial PRIMARY KEY,
      part_id integer NOT NULL REFERENCES parts(id),
      round integer NOT NULL,
      section text NOT NULL CHECK (section IN
        ('surface-prep','climate','thickness-gauge','holiday','cure','adhesion','notes')),
      data jsonb NOT NULL,
      instrument_id integer REFERENCES instruments(id),
      recorded_by integer NOT NULL REFERENCES users(id),
      recorded_at timestamptz NOT NULL DEFAULT now(),
      client_id uuid NOT NULL UNIQUE
    );
    CREATE INDEX section_records_part ON section_records (part_id, round, section, id);

    CREATE TABLE gauge_readings (
      id bigserial PRIMARY KEY,
      part_id integer NOT NULL REFERENCES parts(id),
      lot_id integer NOT NULL REFERENCES lots(id),
      round integer NOT NULL,
      area_no integer NOT NULL CHECK (area_no >= 1),
      spot_no integer NOT NULL CHECK (spot_no >= 0),
      thickness_um double precision NOT NULL CHECK (thickness_um >= 0),
      instrument_id integer NOT NULL REFERENCES instruments(id),
      recorded_by integer NOT NULL REFERENCES users(id),
      recorded_at timestamptz NOT NULL DEFAULT now(),
      taken_at timestamptz NOT NULL DEFAULT now(),
      client_id uuid NOT NULL UNIQUE,
      suspect boolean NOT NULL DEFAULT false,
      discarded_at timestamptz,
      discard_reason text,
      discarded_by integer REFERENCES users(id),
      CHECK ((discarded_at IS NULL) = (discard_reason IS NULL))
    );
    CREATE INDEX gauge_readings_part_round ON gauge_readings (part_id, round);
    CREATE INDEX gauge_readings_instrument_taken ON gauge_readings (instrument_id, taken_at);
    CREATE INDEX gauge_readings_instrument_recorded ON gauge_readings (instrument_id, recorded_at);
    CREATE INDEX gauge_readings_lot ON gauge_readings (lot_id);

    -- A reading is evidence: its value, gauge, place and time never change. Only the flags
    -- (suspect, discarded with a reason) may be set; nothing is deleted.
    CREATE FUNCTION gauge_readings_guard() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'gauge readings are never deleted: discard with a reason instead'
          USING ERRCODE = 'insufficient_privilege';
      END IF;
      IF (NEW.part_id, NEW.lot_id, NEW.round, NEW.area_no, NEW.spot_no, NEW.thickness_um,
          NEW.instrument_id, NEW.recorded_by, NEW.recorded_at, NEW.taken_at, NEW.client_id)
         IS DISTINCT FROM
         (OLD.part_id, OLD.lot_id, OLD.round, OLD.area_no, OLD.spot_no, OLD.thickness_um,
          OLD.instrument_id, OLD.recorded_by, OLD.recorded_at, OLD.taken_at, OLD.client_id)
         OR (OLD.discarded_at IS NOT NULL AND NEW.discarded_at IS DISTINCT FROM OLD.discarded_at)
         OR (OLD.suspect AND NOT NEW.suspect) THEN
        RAISE EXCEPTION 'a gauge reading is evidence: only its suspect and discard flags may be set'
          USING ERRCODE = 'insufficient_privilege';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER gauge_readings_evidence BEFORE UPDATE OR DELETE ON gauge_readings
      FOR EACH ROW EXECUTE FUNCTION gauge_readings_guard();

    CREATE FUNCTION section_records_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'section_records is append-only: % refused', TG_OP USING ERRCODE = 'insufficient_privilege';
    END $$;
    CREATE TRIGGER section_records_append_only BEFORE UPDATE OR DELETE ON section_records
      FOR EACH ROW EXECUTE FUNCTION section_records_refuse_change();

    CREATE TABLE instrument_verifications (
      id serial PRIMARY KEY,
      instrument_id integer NOT NULL REFERENCES instruments(id),
      reference_nominal_um double precision NOT NULL,
      tolerance_um double precision NOT NULL,
      reading_um double precision NOT NULL,
      passed boolean NOT NULL,
      occasion text NOT NULL CHECK (occasion IN ('start-of-shift','end-of-shift','other')),
      verified_by integer NOT NULL REFERENCES users(id),
      verified_at timestamptz NOT NULL DEFAULT now(),
      client_id uuid NOT NULL UNIQUE
    );
    CREATE INDEX instrument_verifications_instrument ON instrument_verifications (instrument_id, verified_at);

    CREATE TABLE photos (
      id serial PRIMARY KEY,
      lot_id integer NOT NULL REFERENCES lots(id),
      part_id integer REFERENCES parts(id),
      -- Nonconformance records come with a later feature, which adds the foreign key.
      nonconformance_id integer,
      caption text NOT NULL DEFAULT '',
      mime text NOT NULL CHECK (mime IN ('image/jpeg','image/png','image/webp','image/heic')),
      byte_size integer NOT NULL,
      width integer NOT NULL,
      height integer NOT NULL,
      data bytea NOT NULL,
      thumb bytea NOT NULL,
      uploaded_by integer NOT NULL REFERENCES users(id),
      uploaded_at timestamptz NOT NULL DEFAULT now(),
      client_id uuid NOT NULL UNIQUE
    );
    CREATE INDEX photos_lot ON photos (lot_id, id);
    CREATE INDEX photos_part ON photos (part_id) WHERE part_id IS NOT NULL;
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TABLE photos, instrument_verifications, gauge_readings, section_records, parts, lots,
      lot_number_counters;
    DROP FUNCTION gauge_readings_guard();
    DROP FUNCTION section_records_refuse_change();
  `)
}
