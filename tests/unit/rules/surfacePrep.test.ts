import { describe, expect, it } from 'vitest'
import { CLEANLINESS_GRADES } from '../../../shared/spec/specContent'
import {
  cleanlinessMeets,
  evaluateProfile,
  milsToMicrons as mil,
  profileLocationValueUm,
  REPLICA_BACKING_UM,
  replicaProfileUm,
} from '../../../shared/rules/index'

describe('cleanliness grades, SSPC ⇄ ISO 8501-1, least → most thorough [R]', () => {
  it('a grade meets itself and every less thorough grade, not a more thorough one', () => {
    expect(cleanlinessMeets('SSPC-SP10/Sa2.5', 'SSPC-SP10/Sa2.5')).toBe(true)
    expect(cleanlinessMeets('SSPC-SP10/Sa2.5', 'SSPC-SP5/Sa3')).toBe(true) // white metal beats near-white
    expect(cleanlinessMeets('SSPC-SP10/Sa2.5', 'SSPC-SP6/Sa2')).toBe(false) // commercial is short
    expect(cleanlinessMeets('SSPC-SP10/Sa2.5', 'SSPC-SP14')).toBe(false) // industrial (< 10 % residue)
    expect(cleanlinessMeets('SSPC-SP6/Sa2', 'SSPC-SP14')).toBe(true)
    expect(cleanlinessMeets('SSPC-SP7/Sa1', 'SSPC-SP6/Sa2')).toBe(true)
  })
  it('order matches CLEANLINESS_GRADES for every pair', () => {
    CLEANLINESS_GRADES.forEach((req, i) =>
      CLEANLINESS_GRADES.forEach((got, j) => expect(cleanlinessMeets(req, got)).toBe(j >= i)),
    )
  })
})

describe('profile by ASTM D4417 [R]', () => {
  it('replica tape: subtract the 2.0 mil (50.8 µm) backing [R]', () => {
    expect(REPLICA_BACKING_UM).toBeCloseTo(50.8, 12)
    expect(replicaProfileUm(mil(4.5))).toBeCloseTo(mil(2.5), 9)
    // Coarse tape reading 3.0 mil with backing → 1.0 mil profile
    expect(
      profileLocationValueUm('C-replica-tape', { readingsUm: [mil(3.0)] }).valueUm,
    ).toBeCloseTo(mil(1.0), 9)
  })

  it('method B depth micrometer uses the largest reading at a location (D4417 B, from memory [M])', () => {
    expect(profileLocationValueUm('B-depth-micrometer', { readingsUm: [60, 75, 70] }).valueUm).toBe(
      75,
    )
  })

  it('method A comparator: mean of the recorded values', () => {
    expect(profileLocationValueUm('A-comparator', { readingsUm: [60, 70] }).valueUm).toBe(65)
  })

  it('overlap rule as a setting: both grades in 1.5–2.5 mil → averaged; off → first reading used [R]', () => {
    const loc = {
      readingsUm: [mil(2 + 1.8)],
      tapeGrade: 'coarse' as const,
      retestReadingsUm: [mil(2 + 2.2)],
    }
    expect(profileLocationValueUm('C-replica-tape', loc, true).valueUm).toBeCloseTo(mil(2.0), 9)
    expect(profileLocationValueUm('C-replica-tape', loc, false).valueUm).toBeCloseTo(mil(1.8), 9)
    // setting on and no re-test yet: not a measurement
    expect(
      profileLocationValueUm('C-replica-tape', { readingsUm: [mil(3.8)] }, true).valueUm,
    ).toBeNull()
    // re-test above the overlap: the X-Coarse reading is used
    const up = { readingsUm: [mil(4.4)], retestReadingsUm: [mil(5.0)] }
    expect(profileLocationValueUm('C-replica-tape', up, true).valueUm).toBeCloseTo(mil(3.0), 9)
  })

  it('a coarse tape read above its 2.5 mil range needs the X-Coarse grade [R]', () => {
    expect(
      profileLocationValueUm('C-replica-tape', { readingsUm: [mil(2 + 2.6)] }).valueUm,
    ).toBeNull()
    const r = profileLocationValueUm('C-replica-tape', {
      readingsUm: [mil(4.6)],
      retestReadingsUm: [mil(5.1)],
    })
    expect(r.valueUm).toBeCloseTo(mil(3.1), 9)
  })

  it('tape grade ranges: Coarse 0.8–2.5 mil, X-Coarse 1.5–4.5 mil, both edges [R]', () => {
    const v = (profileMil: number, tapeGrade: 'coarse' | 'x-coarse') =>
      profileLocationValueUm('C-replica-tape', { readingsUm: [mil(2 + profileMil)], tapeGrade })
        .valueUm
    expect(v(0.8, 'coarse')).toBeCloseTo(mil(0.8), 9)
    expect(v(0.79, 'coarse')).toBeNull()
    expect(v(2.5, 'coarse')).toBeCloseTo(mil(2.5), 9)
    expect(v(2.51, 'coarse')).toBeNull()
    expect(v(1.5, 'x-coarse')).toBeCloseTo(mil(1.5), 9)
    expect(v(1.49, 'x-coarse')).toBeNull()
    expect(v(4.5, 'x-coarse')).toBeCloseTo(mil(4.5), 9)
    expect(v(4.51, 'x-coarse')).toBeNull()
  })

  it('band check 1.5–4 mil (38.1–101.6 µm, FBE typical [M]): both edges pass, outside fails', () => {
    const band = { minUm: mil(1.5), maxUm: mil(4) }
    const run = (um: number) =>
      evaluateProfile('B-depth-micrometer', [{ readingsUm: [um] }], band).status
    expect(run(mil(1.5))).toBe('pass')
    expect(run(mil(1.49))).toBe('fail')
    expect(run(mil(4))).toBe('pass')
    expect(run(mil(4.01))).toBe('fail')
    expect(run(38.1)).toBe('pass')
    expect(run(38)).toBe('fail')
    const r = evaluateProfile(
      'B-depth-micrometer',
      [{ readingsUm: [60] }, { readingsUm: [110] }],
      band,
    )
    expect(r.reasons[0]).toMatch(/location 2: 4\.33 mil \(110\.0 µm\) is 8\.4 µm above/)
  })

  it('no locations is incomplete', () => {
    expect(evaluateProfile('A-comparator', [], { minUm: 38, maxUm: 100 }).status).toBe('incomplete')
  })
})
