/**
 * One INSERT for a whole batch, or for the batches of several parts stored together (every
 * column is one array element per reading). ON CONFLICT (client_id) DO NOTHING makes a replayed batch store
 * nothing twice. A reading is stored suspect when the gauge's verification just before it failed
 * (the gauge was known bad) or the one just after it failed (the failure reaches back to the last
 * good check): the same rule the verification marks by, applied to readings that arrive late
 * from a tablet that was offline.
 */
export const INSERT_READINGS = `
  INSERT INTO gauge_readings
    (part_id, lot_id, round, area_no, spot_no, thickness_um, instrument_id, recorded_by, taken_at, client_id, suspect)
  SELECT v.part_id, v.lot_id, v.round, v.area_no, v.spot_no, v.thickness_um, v.instrument_id, v.recorded_by,
         v.taken_at, v.client_id,
         coalesce((SELECT NOT iv.passed FROM instrument_verifications iv
                    WHERE iv.instrument_id = v.instrument_id AND iv.verified_at <= v.taken_at
                    ORDER BY iv.verified_at DESC LIMIT 1), false)
      OR coalesce((SELECT NOT iv.passed FROM instrument_verifications iv
                    WHERE iv.instrument_id = v.instrument_id AND iv.verified_at >= v.taken_at
                    ORDER BY iv.verified_at ASC LIMIT 1), false)
    FROM (SELECT u.part_id, u.lot_id, u.round, u.recorded_by, u.area_no, u.spot_no, u.thickness_um,
                 u.instrument_id, coalesce(u.taken_at, now()) AS taken_at, u.client_id
            FROM unnest($1::int[], $2::int[], $3::int[], $4::int[], $5::int[], $6::int[], $7::float8[],
                        $8::int[], $9::timestamptz[], $10::uuid[])
              AS u(part_id, lot_id, round, recorded_by, area_no, spot_no, thickness_um, instrument_id,
                   taken_at, client_id)) v
  ON CONFLICT (client_id) DO NOTHING
  RETURNING id, part_id, client_id, suspect, taken_at, recorded_at`

/** Readings of other parts that already hold one of these clientIds (a reused id, not a replay). */
export const FOREIGN_CLIENT_IDS = `
  SELECT client_id FROM gauge_readings WHERE client_id = ANY($1::uuid[]) AND part_id <> $2 LIMIT 1`
