/**
 * The SQL that writes a large invented history (Harrowgate Flow Works): lots, parts, gauge
 * readings, round-1 holiday records, verdicts and nonconformances — all generated inside
 * PostgreSQL with generate_series, so a million readings never pass through Node.
 *
 * The thickness process, per spec, in units of the band width W (lsl..usl; 0.6 × lsl without a
 * maximum), around a target at 55 % of the band:
 *   part mean = target + W × ( 0.05 sin(2π t / 26 weeks)        slow seasonal drift
 *                              − 0.07 on night shift (3)        cold parts out of the night preheat
 *                              + 0.12 in weeks 60–66 % of span  a worn powder-gun tip, then fixed
 *                              + N(0, 0.06) per lot             batch and racking
 *                              + N(0, 0.11) per part )
 *   reading = part mean + N(0, 0.06 W), rounded to 0.1 µm (gauge resolution).
 * A part fails first pass when its mean is outside the band, when a holiday stays unrepaired, or
 * (rarely, more often in the humid summer weeks) on prep, climate, cure or adhesion.
 */
export interface HistoryOptions {
  parts: number
  weeks: number
  readingsPerPart: number
  seed: number
  /** Lot number infix, so several runs never collide: F2507-G0012. */
  tag: string
}

/** Box–Muller: one standard normal deviate per call, from two uniform ones. */
const NORMAL = `(sqrt(-2 * ln(1 - random())) * cos(2 * pi() * random()))`

export function historySteps(o: HistoryOptions): { label: string; sql: string }[] {
  const lots = Math.max(1, Math.round(o.parts / 20))
  const span = `(${o.weeks} * 7)`
  return [
    { label: 'seed the random generator', sql: `SELECT setseed(${(o.seed % 1000) / 1000})` },
    {
      label: 'plan lots',
      sql: `
      CREATE TEMP TABLE h_spec AS
        SELECT c.id AS spec_id, c.current_version AS version, c.customer_id,
               CASE WHEN c.code ILIKE '%FBE%' OR c.title ILIKE '%FBE%' THEN 'fbe-powder' ELSE 'liquid-epoxy' END AS line,
               (v.content #>> '{thickness,minUm}')::float8 AS lsl,
               (v.content #>> '{thickness,maxUm}')::float8 AS usl,
               row_number() OVER (ORDER BY c.id) AS k
          FROM coating_specs c JOIN spec_versions v ON v.spec_id = c.id AND v.version = c.current_version
         WHERE c.active;
      ALTER TABLE h_spec ADD COLUMN w float8;
      UPDATE h_spec SET w = CASE WHEN usl > lsl THEN usl - lsl ELSE 0.6 * lsl END;
      CREATE TEMP TABLE h_lot AS
        SELECT g AS k,
               -- The first spec carries half of the work, the others share the rest.
               CASE WHEN random() < 0.5 THEN 1 ELSE 1 + floor(random() * (SELECT count(*) FROM h_spec))::int END AS spec_k,
               (1 + floor(random() * 3))::int::text AS shift,
               (now()::date - ${span}) + floor(random() * ${span})::int AS day,
               10 + floor(random() * 21)::int AS nparts,
               ${NORMAL} AS lot_effect,
               gen_random_uuid() AS client_id
          FROM generate_series(1, ${lots}) g;
      ALTER TABLE h_lot ADD COLUMN at timestamptz, ADD COLUMN spec_id integer;
      UPDATE h_lot l SET spec_id = s.spec_id FROM h_spec s WHERE s.k = l.spec_k;
      UPDATE h_lot SET at = day + make_interval(hours => CASE shift WHEN '1' THEN 6 WHEN '2' THEN 14 ELSE 22 END)
                        + make_interval(mins => floor(random() * 300)::int);`,
    },
    {
      label: 'insert lots',
      sql: `
      INSERT INTO lots (lot_number, customer_id, order_ref, spec_id, spec_version, line, shift,
                        coating_material, batch_number, batch_expires_on, status, opened_by,
                        client_id, created_at, updated_at)
      SELECT CASE s.line WHEN 'fbe-powder' THEN 'F' ELSE 'L' END || to_char(l.at, 'IYIW') || '-${o.tag}' || lpad(l.k::text, 5, '0'),
             coalesce(s.customer_id, (SELECT id FROM customers WHERE active ORDER BY random() + l.k * 0 LIMIT 1)),
             'HIST-' || (40000 + l.k), s.spec_id, s.version, s.line, l.shift,
             CASE s.line WHEN 'fbe-powder' THEN 'FBE powder, green, fictional grade HF-206' ELSE 'Two-part liquid epoxy, fictional grade LE-30' END,
             'B' || to_char(l.at, 'YYMM') || '-' || (1 + l.k % 7), (l.at + interval '180 days')::date, 'released',
             (SELECT id FROM users WHERE role = 'operator' ORDER BY id LIMIT 1), l.client_id, l.at, l.at
        FROM h_lot l JOIN h_spec s ON s.spec_id = l.spec_id;
      UPDATE spec_versions v SET locked_at = coalesce(locked_at, now())
        FROM h_spec s WHERE v.spec_id = s.spec_id AND v.version = s.version;`,
    },
    {
      label: 'plan parts',
      sql: `
      CREATE TEMP TABLE h_part AS
        SELECT lots.id AS lot_id, l.at + make_interval(mins => 3 * g) AS at, g AS seq, s.lsl, s.usl, s.w,
               lots.shift, l.lot_effect, gen_random_uuid() AS client_id,
               (ARRAY['VB','FT','SP','CV','DS'])[1 + floor(random() * 5)::int] AS family,
               greatest(3, ${o.readingsPerPart} - 10 + floor(random() * 21)::int) AS nreadings,
               extract(epoch FROM (l.at - (now() - make_interval(days => ${span})))) / 86400.0 / ${span} AS frac
          FROM h_lot l JOIN lots ON lots.client_id = l.client_id JOIN h_spec s ON s.spec_id = l.spec_id,
               generate_series(1, l.nparts) g;
      ALTER TABLE h_part ADD COLUMN true_mean float8;
      UPDATE h_part SET true_mean = lsl + w * (0.55
          + 0.05 * sin(2 * pi() * frac * ${o.weeks} / 26.0)
          - CASE WHEN shift = '3' THEN 0.07 ELSE 0 END
          + CASE WHEN frac BETWEEN 0.60 AND 0.66 THEN 0.12 ELSE 0 END
          + 0.06 * lot_effect + 0.11 * ${NORMAL});`,
    },
    {
      label: 'insert parts',
      sql: `
      INSERT INTO parts (lot_id, part_number, description, heat_number, quantity, coated_area_m2,
                         client_id, created_at, updated_at)
      SELECT lot_id, family || '-' || (ARRAY['100','150','200','250','300'])[1 + seq % 5] || '-' || (ARRAY['FL','MJ','PE'])[1 + seq % 3],
             CASE family WHEN 'VB' THEN 'Gate valve body' WHEN 'FT' THEN 'Tee fitting' WHEN 'SP' THEN 'Flanged spool'
                         WHEN 'CV' THEN 'Bonnet cover' ELSE 'Butterfly disc' END,
             'H' || (700000 + lot_id * 40 + seq), 1, round((0.2 + random() * 1.6)::numeric, 2)::float8,
             client_id, at, at
        FROM h_part;
      ALTER TABLE h_part ADD COLUMN part_id integer;
      UPDATE h_part h SET part_id = p.id FROM parts p WHERE p.client_id = h.client_id;`,
    },
    {
      label: 'insert gauge readings',
      sql: `
      INSERT INTO gauge_readings (part_id, lot_id, round, area_no, spot_no, thickness_um, instrument_id,
                                  recorded_by, recorded_at, taken_at, client_id)
      SELECT h.part_id, h.lot_id, 1, 1 + (g - 1) / 15, 1 + ((g - 1) % 15) / 3,
             greatest(0, round((h.true_mean + 0.06 * h.w * ${NORMAL})::numeric, 1))::float8,
             (SELECT id FROM instruments WHERE kind LIKE 'dft-gauge%' ORDER BY id LIMIT 1),
             (SELECT id FROM users WHERE role = 'operator' ORDER BY id LIMIT 1),
             h.at + make_interval(secs => 20 * g), h.at + make_interval(secs => 20 * g), gen_random_uuid()
        FROM h_part h, generate_series(1, h.nreadings) g;`,
    },
    ...verdictSteps(),
  ]
}

/** Holidays, the part's mean and verdict, and a nonconformance per first-pass failure. */
function verdictSteps(): { label: string; sql: string }[] {
  return [
    {
      label: 'compute part means',
      sql: `
      ALTER TABLE h_part ADD COLUMN mean_um float8, ADD COLUMN holidays int, ADD COLUMN open_holidays int,
        ADD COLUMN other_fail text;
      UPDATE h_part h SET mean_um = r.m FROM (
        SELECT part_id, avg(thickness_um) AS m FROM gauge_readings
         WHERE part_id IN (SELECT part_id FROM h_part) GROUP BY part_id) r
       WHERE r.part_id = h.part_id;
      -- Thin film holds more pinholes: the rate climbs as the mean nears the minimum.
      ALTER TABLE h_part ADD COLUMN p_holiday float8;
      UPDATE h_part SET p_holiday = least(0.9, 0.05 + 0.5 * greatest(0, 1 - (mean_um - lsl) / (0.35 * w)));
      UPDATE h_part SET holidays = (random() < p_holiday)::int + (random() < p_holiday / 2)::int
                                 + (random() < p_holiday / 4)::int;
      UPDATE h_part SET open_holidays = CASE WHEN holidays > 0 AND random() < 0.08 THEN 1 ELSE 0 END,
        other_fail = CASE WHEN random() < 0.004 + 0.006 * greatest(0, sin(2 * pi() * (frac * 52 - 20) / 52)) THEN 'climate'
                          WHEN random() < 0.006 THEN 'surface-prep'
                          WHEN random() < 0.003 THEN 'cure'
                          WHEN random() < 0.004 THEN 'adhesion' END;`,
    },
    {
      label: 'insert holiday records',
      sql: `
      INSERT INTO section_records (part_id, round, section, data, recorded_by, recorded_at, client_id)
      SELECT part_id, 1, 'holiday',
             jsonb_build_object('method', 'high-voltage', 'voltageUsedV', 1800 + 25 * floor(random() * 8),
               'holidays', coalesce((SELECT jsonb_agg(jsonb_build_object('found', true,
                   'repaired', i > open_holidays, 'retested', i > open_holidays, 'location', 'spot ' || i))
                 FROM generate_series(1, holidays) i), '[]'::jsonb)),
             (SELECT id FROM users WHERE role = 'operator' ORDER BY id LIMIT 1), at + interval '20 minutes',
             gen_random_uuid()
        FROM h_part;`,
    },
    {
      label: 'store verdicts',
      sql: `
      ALTER TABLE h_part ADD COLUMN failing text[];
      UPDATE h_part SET failing = array_remove(ARRAY[
          CASE WHEN other_fail = 'surface-prep' THEN 'surface-prep' END,
          CASE WHEN other_fail = 'climate' THEN 'climate' END,
          CASE WHEN mean_um < lsl OR mean_um > usl THEN 'thickness' END,
          CASE WHEN open_holidays > 0 THEN 'holiday' END,
          CASE WHEN other_fail = 'cure' THEN 'cure' END,
          CASE WHEN other_fail = 'adhesion' THEN 'adhesion' END], NULL);
      -- The trigger that keeps holidays_found_r1 is off during the bulk load: set it here.
      UPDATE parts p SET thickness_mean_um = h.mean_um, holidays_found_r1 = h.holidays,
             verdict_status = CASE WHEN cardinality(h.failing) > 0 THEN 'fail' ELSE 'pass' END,
             first_pass_status = CASE WHEN cardinality(h.failing) > 0 THEN 'fail' ELSE 'pass' END,
             verdict = jsonb_build_object(
               'status', CASE WHEN cardinality(h.failing) > 0 THEN 'fail' ELSE 'pass' END,
               'partLabel', p.part_number,
               'reason', CASE WHEN cardinality(h.failing) > 0 THEN 'Fails: ' || array_to_string(h.failing, ', ')
                              ELSE 'Every criterion conforms.' END || ' (generated history)',
               'criteria', (SELECT jsonb_agg(jsonb_build_object('criterion', c,
                   'status', CASE WHEN c = ANY (h.failing) THEN 'fail' ELSE 'pass' END,
                   'reason', 'Generated history', 'numbers',
                   CASE WHEN c = 'thickness' THEN jsonb_build_object('meanUm', h.mean_um) ELSE '{}'::jsonb END)
                   ORDER BY o) FROM unnest(ARRAY['surface-prep','climate','thickness','holiday','cure','adhesion'])
                   WITH ORDINALITY AS x(c, o)),
               'samplingPlan', jsonb_build_object('rule', 'SSPC-PA2', 'coatedAreaFt2', null,
                 'areasRequired', null, 'spotsRequired', null, 'readingsRequired', h.nreadings,
                 'areasRecorded', 1, 'spotsRecorded', 5, 'readingsRecorded', h.nreadings, 'complete', true,
                 'progress', h.nreadings || ' of ' || h.nreadings || ' readings', 'derivation', 'generated history'))
        FROM h_part h WHERE p.id = h.part_id;`,
    },
    {
      label: 'insert nonconformances',
      sql: `
      INSERT INTO defect_types (code, label)
      VALUES ('thin-film', 'Film below minimum DFT'), ('thick-film', 'Film above maximum DFT'),
             ('holiday-unrepaired', 'Holiday not repaired'), ('surface-contamination', 'Surface preparation short of grade'),
             ('climate-out', 'Climate outside limits'), ('under-cure', 'Under-cure'), ('poor-adhesion', 'Poor adhesion')
      ON CONFLICT (code) DO NOTHING;
      CREATE TEMP TABLE h_nc AS
        SELECT h.part_id, h.lot_id, c AS criterion, gen_random_uuid() AS key,
               CASE c WHEN 'thickness' THEN CASE WHEN h.mean_um < h.lsl THEN 'thin-film' ELSE 'thick-film' END
                      WHEN 'holiday' THEN 'holiday-unrepaired' WHEN 'surface-prep' THEN 'surface-contamination'
                      WHEN 'climate' THEN 'climate-out' WHEN 'cure' THEN 'under-cure' ELSE 'poor-adhesion' END AS code,
               h.at
          FROM h_part h, unnest(h.failing) c;
      INSERT INTO nonconformances (number, lot_id, status, source, criterion, defect_type_id, description,
                                   disposition, disposition_note, verification, closed_at, opened_by, created_at, updated_at)
      SELECT 'NC-H-' || n.key, n.lot_id, 'closed', 'auto', n.criterion, d.id,
             'Opened on submission (generated history)', 'repair-retest', '', 'Retested clear (generated history)',
             n.at + interval '1 day', (SELECT id FROM users WHERE role = 'supervisor' ORDER BY id LIMIT 1), n.at, n.at
        FROM h_nc n JOIN defect_types d ON d.code = n.code;
      INSERT INTO nonconformance_parts (nonconformance_id, part_id, round_found)
      SELECT nc.id, n.part_id, 1 FROM h_nc n JOIN nonconformances nc ON nc.number = 'NC-H-' || n.key;`,
    },
  ]
}
