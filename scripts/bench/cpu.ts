/**
 * CPU time spent by the server process and by the PostgreSQL backends during a load, from
 * /proc (Linux). On a shared, busy machine wall-clock figures swing with the neighbours; CPU
 * milliseconds per request barely do, so they say where the time goes (node or the database)
 * and whether a change helped.
 */
import { readFileSync, readdirSync } from 'node:fs'
import pg from 'pg'

const TICK_MS = 10 // USER_HZ is 100 on Linux

function statOf(pid: number): { ppid: number; cpuMs: number } | null {
  try {
    const s = readFileSync(`/proc/${pid}/stat`, 'utf8')
    const f = s.slice(s.lastIndexOf(')') + 2).split(' ')
    // fields after the name: state ppid ... utime(12) stime(13) (1-based after the name: 14, 15)
    return { ppid: Number(f[1]), cpuMs: (Number(f[11]) + Number(f[12])) * TICK_MS }
  } catch {
    return null
  }
}

export function processCpuMs(pid: number): number {
  return statOf(pid)?.cpuMs ?? NaN
}

/** CPU of every child of the postmaster (the backends, and the background processes), by pid. */
export function postgresCpuMs(postmasterPid: number): Map<number, number> {
  const byPid = new Map<number, number>()
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue
    const st = statOf(Number(name))
    if (st && st.ppid === postmasterPid) byPid.set(Number(name), st.cpuMs)
  }
  return byPid
}

/** CPU the backends spent between two readings: a backend that exited meanwhile counts 0. */
function postgresCpuSince(before: Map<number, number>, postmasterPid: number): number {
  let total = 0
  for (const [pid, ms] of postgresCpuMs(postmasterPid)) total += ms - (before.get(pid) ?? 0)
  return total
}

export function postmasterPidOf(dataDir: string): number {
  return Number(readFileSync(`${dataDir}/postmaster.pid`, 'utf8').split('\n')[0])
}

export interface CpuSpan {
  /** CPU ms per request, server process and PostgreSQL. */
  end(requests: number): { serverMsPerReq: number; postgresMsPerReq: number }
}

export function cpuSpan(serverPid: number, postmasterPid: number): CpuSpan {
  const s0 = processCpuMs(serverPid)
  const p0 = postgresCpuMs(postmasterPid)
  return {
    end(requests: number) {
      // a backend that exited during the span (an idle pooled connection closing) takes its
      // CPU of the span with it: slightly low, never high, never below zero
      return {
        serverMsPerReq: (processCpuMs(serverPid) - s0) / requests,
        postgresMsPerReq: postgresCpuSince(p0, postmasterPid) / requests,
      }
    },
  }
}

/** The data folder of the cluster behind a database URL (to find its postmaster). */
export async function dataDirectory(url: string) {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    const { rows } = await db.query<{ d: string }>('SELECT current_setting($1) AS d', [
      'data_directory',
    ])
    return rows[0]!.d
  } finally {
    await db.end()
  }
}
