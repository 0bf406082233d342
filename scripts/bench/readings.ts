/**
 * reading_post_*: a spot of three readings (one clientId each) saved through the real API with
 * its verdict, from 50 connections, spread round-robin over many parts of open lots (so the part
 * and lot row locks do not serialise everything), each part filling SSPC-PA 2 spots 1–5 of area
 * 1, then area 2, and so on. The bare route is loaded the same way right after, in the same
 * server process: reading_post_overhead_ratio = p95(readings) ÷ p95(bare insert).
 */
import { randomUUID } from 'node:crypto'
import { runLoad, type LoadResult } from './load'
import type { ReadingTargets } from './prepare'

export function readingRequests(targets: ReadingTargets) {
  const spotsTaken = new Map<number, number>()
  let next = 0
  return () => {
    const partId = targets.partIds[next++ % targets.partIds.length]!
    const k = spotsTaken.get(partId) ?? 0
    spotsTaken.set(partId, k + 1)
    const areaNo = Math.floor(k / 5) + 1
    const spotNo = (k % 5) + 1
    // 12–20 mil band (305–508 µm): readings around 15–16 mil
    const readings = [0, 1, 2].map(() => ({
      clientId: randomUUID(),
      areaNo,
      spotNo,
      thicknessUm: Math.round((380 + Math.random() * 60) * 10) / 10,
      instrumentId: targets.instrumentId,
    }))
    return {
      path: `/api/parts/${partId}/readings`,
      body: JSON.stringify({ readings }),
      ids: readings.map((r) => r.clientId),
    }
  }
}

export async function loadReadings(
  base: string,
  auth: string,
  targets: ReadingTargets,
  durationS: number,
  connections = 50,
): Promise<LoadResult> {
  return runLoad({
    url: base,
    connections,
    durationS,
    headers: { authorization: auth },
    next: readingRequests(targets),
  })
}

export async function loadBare(
  base: string,
  durationS: number,
  connections = 50,
): Promise<LoadResult> {
  return runLoad({
    url: base,
    connections,
    durationS,
    headers: {},
    next: () => ({
      path: '/api/_bench/bare',
      body: JSON.stringify({ clientId: randomUUID(), thicknessUm: 400 }),
    }),
  })
}
