import { startOutboxWorker } from './mail'

/** Background workers (the certificate mail outbox) started beside the HTTP server. */
const stops: (() => Promise<void>)[] = []

export function registerWorker(start: () => () => Promise<void>) {
  stops.push(start())
}

export function startBackgroundWorkers() {
  // Workers register themselves here as features add them. Tests start their own.
  registerWorker(startOutboxWorker)
}

export async function stopBackgroundWorkers() {
  await Promise.all(stops.map((stop) => stop()))
}
