/** Background workers (the certificate outbox, later) started beside the HTTP server. */
const stops: (() => Promise<void>)[] = []

export function registerWorker(start: () => () => Promise<void>) {
  stops.push(start())
}

export function startBackgroundWorkers() {
  // Workers register themselves here as features add them.
}

export async function stopBackgroundWorkers() {
  await Promise.all(stops.map((stop) => stop()))
}
