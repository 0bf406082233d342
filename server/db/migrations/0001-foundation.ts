import type { MigrationContext } from '../migrate'

/** People, customers, coating specs (versioned), instruments, settings and the append-only audit trail. */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE customers (
      id serial PRIMARY KEY,
      name text NOT NULL,
      code text NOT NULL UNIQUE,
      address text NOT NULL DEFAULT '',
      thickness_unit text NOT NULL DEFAULT 'um' CHECK (thickness_unit IN ('um','mil')),
      active boolean NOT NULL DEFAULT true,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX customers_name_lower ON customers (lower(name));

    CREATE TABLE customer_contacts (
      id serial PRIMARY KEY,
      customer_id integer NOT NULL REFERENCES customers(id),
      name text NOT NULL,
      email text NOT NULL,
      receives_certificates boolean NOT NULL DEFAULT true,
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX customer_contacts_customer ON customer_contacts (customer_id);

    CREATE TABLE users (
      id serial PRIMARY KEY,
      email text NOT NULL,
      name text NOT NULL,
      role text NOT NULL CHECK (role IN ('operator','supervisor','manager','admin','customer')),
      password_hash text NOT NULL,
      active boolean NOT NULL DEFAULT true,
      customer_id integer REFERENCES customers(id),
      thickness_unit text NOT NULL DEFAULT 'um' CHECK (thickness_unit IN ('um','mil')),
      temperature_unit text NOT NULL DEFAULT 'C' CHECK (temperature_unit IN ('C','F')),
      area_unit text NOT NULL DEFAULT 'm2' CHECK (area_unit IN ('m2','ft2')),
      failed_logins integer NOT NULL DEFAULT 0,
      locked_until timestamptz,
      token_version integer NOT NULL DEFAULT 0,
      last_login_at timestamptz,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((role = 'customer') = (customer_id IS NOT NULL))
    );
    CREATE UNIQUE INDEX users_email_lower ON users (lower(email));

    CREATE TABLE coating_specs (
      id serial PRIMARY KEY,
      code text NOT NULL UNIQUE,
      title text NOT NULL,
      customer_id integer REFERENCES customers(id),
      current_version integer NOT NULL DEFAULT 1,
      active boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    -- A version is edited in place until a lot uses it (locked_at set); after that a change makes a new version.
    CREATE TABLE spec_versions (
      id serial PRIMARY KEY,
      spec_id integer NOT NULL REFERENCES coating_specs(id),
      version integer NOT NULL,
      content jsonb NOT NULL,
      change_note text NOT NULL DEFAULT '',
      created_by integer REFERENCES users(id),
      locked_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (spec_id, version)
    );

    CREATE TABLE instruments (
      id serial PRIMARY KEY,
      kind text NOT NULL CHECK (kind IN ('dft-gauge-type1','dft-gauge-type2','holiday-low-voltage',
        'holiday-high-voltage','profile-gauge','replica-tape-micrometer','surface-thermometer',
        'hygrometer','oven-recorder')),
      serial text NOT NULL UNIQUE,
      description text NOT NULL DEFAULT '',
      calibrated_on date,
      calibration_due_on date NOT NULL,
      certificate_ref text NOT NULL DEFAULT '',
      active boolean NOT NULL DEFAULT true,
      version integer NOT NULL DEFAULT 1,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE settings (
      key text PRIMARY KEY,
      value jsonb NOT NULL,
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE audit_events (
      id bigserial PRIMARY KEY,
      at timestamptz NOT NULL DEFAULT clock_timestamp(),
      actor_id integer REFERENCES users(id),
      actor_email text,
      action text NOT NULL,
      entity_type text NOT NULL,
      entity_id text NOT NULL,
      lot_id integer,
      before jsonb,
      after jsonb,
      note text NOT NULL DEFAULT ''
    );
    CREATE INDEX audit_events_entity ON audit_events (entity_type, entity_id);
    CREATE INDEX audit_events_actor_at ON audit_events (actor_id, at);
    CREATE INDEX audit_events_lot ON audit_events (lot_id) WHERE lot_id IS NOT NULL;
    CREATE INDEX audit_events_at ON audit_events (at);

    -- History cannot be rewritten, not even by a bug in the app or by hand in psql.
    CREATE FUNCTION audit_events_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit_events is append-only: % refused', TG_OP USING ERRCODE = 'insufficient_privilege';
    END $$;
    CREATE TRIGGER audit_events_no_update_delete BEFORE UPDATE OR DELETE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_refuse_change();
    CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events
      FOR EACH STATEMENT EXECUTE FUNCTION audit_events_refuse_change();
  `)
}

export async function down() {
  throw new Error('The foundation migration is not reversible: it holds the audit trail.')
}
