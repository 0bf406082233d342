import type { Server } from 'node:http'
import { env } from './config/env'
import { logger } from './lib/logger'
import { sequelize } from './db'
import { createApp } from './app'
import { refuseDemoPasswordsInProduction } from './db/seeders/demoGuard'
import { startBackgroundWorkers, stopBackgroundWorkers } from './workers'

async function main() {
  await sequelize.authenticate()
  if (env.NODE_ENV === 'production') await refuseDemoPasswordsInProduction()
  const app = createApp()
  const server: Server = app.listen(env.PORT, env.HOST, () => {
    logger.info(`Filmtrail listening on http://${env.HOST}:${env.PORT}`)
  })
  startBackgroundWorkers()

  let stopping = false
  const shutdown = async (signal: string) => {
    if (stopping) return
    stopping = true
    logger.info({ signal }, 'shutting down')
    server.close()
    server.closeIdleConnections()
    await stopBackgroundWorkers()
    await sequelize.close()
    logger.info('stopped')
    process.exit(0)
  }
  process.on('SIGINT', () => void shutdown('SIGINT'))
  process.on('SIGTERM', () => void shutdown('SIGTERM'))
}

main().catch((err: unknown) => {
  logger.fatal({ err }, (err as Error).message)
  process.exit(1)
})
