import type { MigrationContext } from '../migrate'

/**
 * Line health (server/api/trends): indexes, and one column the database keeps for it.
 *
 * The parts heap is wide (the verdict jsonb rides in every row), so a year of parts read from the
 * heap is tens of MB per request. parts_trends_created carries every column the aggregates read,
 * keyed on the period filter and the CSV's keyset order (created_at, id): the summary, the
 * thickness statistics and the family filter are index-only scans once autovacuum has marked the
 * pages all-visible. Cost: a verdict recompute changes first_pass_status / thickness_mean_um,
 * which are in the index, so those UPDATEs are no longer HOT — one more index entry per write,
 * at the pace an operator enters readings.
 *
 * parts.holidays_found_r1: holidays found in the part's latest round-1 holiday record. Counting
 * them from the jsonb of 50,000 section records on every request costs a probe and a jsonb walk
 * per part; the trigger below keeps the count as the records arrive (section_records is
 * append-only: the newest row is the current record, so the count is taken from NEW).
 *
 * parts_trends_lot: the thickness section of one spec (see below).
 * parts_first_pass_fail: the Pareto's fallback reads only the parts that failed first pass.
 */
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE parts ADD COLUMN holidays_found_r1 integer;

    CREATE FUNCTION holidays_found_in(data jsonb) RETURNS integer LANGUAGE sql IMMUTABLE AS $$
      SELECT count(*)::int FROM jsonb_array_elements(coalesce(data -> 'holidays', '[]'::jsonb)) h
       WHERE h ->> 'found' = 'true'
    $$;

    CREATE FUNCTION section_records_count_holidays() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.section = 'holiday' AND NEW.round = 1 THEN
        UPDATE parts SET holidays_found_r1 = holidays_found_in(NEW.data) WHERE id = NEW.part_id;
      END IF;
      RETURN NULL;
    END $$;
    CREATE TRIGGER section_records_holidays_r1 AFTER INSERT ON section_records
      FOR EACH ROW EXECUTE FUNCTION section_records_count_holidays();

    UPDATE parts p SET holidays_found_r1 = holidays_found_in(s.data)
      FROM (SELECT DISTINCT ON (part_id) part_id, data FROM section_records
             WHERE section = 'holiday' AND round = 1 ORDER BY part_id, id DESC) s
     WHERE s.part_id = p.id;

    CREATE INDEX parts_trends_created ON parts (created_at, id)
      INCLUDE (lot_id, first_pass_status, thickness_mean_um, quantity, coated_area_m2, sampled,
               holidays_found_r1, part_number);
    -- The thickness section: one spec's lots → their parts in lot and time order, which is the
    -- window's PARTITION BY lot_id ORDER BY created_at, id — read pre-sorted, index-only.
    CREATE INDEX parts_trends_lot ON parts (lot_id, created_at, id)
      INCLUDE (thickness_mean_um, first_pass_status, sampled, part_number);
    CREATE INDEX parts_first_pass_fail ON parts (created_at) WHERE first_pass_status = 'fail';
  `)
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP INDEX parts_first_pass_fail;
    DROP INDEX parts_trends_lot;
    DROP INDEX parts_trends_created;
    DROP TRIGGER section_records_holidays_r1 ON section_records;
    DROP FUNCTION section_records_count_holidays();
    DROP FUNCTION holidays_found_in(jsonb);
    ALTER TABLE parts DROP COLUMN holidays_found_r1;
  `)
}
