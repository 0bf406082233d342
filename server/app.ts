import express from 'express'
import helmet from 'helmet'
import { pinoHttp } from 'pino-http'
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { env } from './config/env'
import { logger } from './lib/logger'
import { apiRouters } from './api'
import { errorHandler, notFoundHandler } from './middleware/errorHandler'
import { mountBenchBareRoute } from './benchBareRoute'
import { noteUnicodeEscapes, refuseUnstorableText } from './middleware/storableText'

/** Builds the Express app (no listen): API under /api, the built client for everything else. */
export function createApp() {
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')
  // No ETag on API answers: nothing revalidates them, and hashing every JSON body costs CPU on
  // each readings POST. The built client's files keep theirs (express.static sets its own).
  app.set('etag', false)
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'script-src': ["'self'"],
          // Fonts are bundled from npm (@fontsource): helmet's default would allow any https: host.
          'font-src': ["'self'", 'data:'],
          'upgrade-insecure-requests': null,
        },
      },
      // Served over plain HTTP on loopback; HSTS belongs to the TLS proxy in front.
      strictTransportSecurity: false,
    }),
  )
  // The access log: one line per request, at level info. At warn or above it would print nothing
  // yet still build a child logger and its serializers for every request (a tenth of a readings
  // POST's server CPU); nothing else uses req.log.
  if (env.NODE_ENV !== 'test' && logger.isLevelEnabled('info')) app.use(pinoHttp({ logger }))
  app.use('/api', express.json({ limit: '2mb', verify: noteUnicodeEscapes }), refuseUnstorableText)
  // BENCHMARK ONLY: the bare yardstick route of npm run bench, never mounted otherwise.
  if (process.env.BENCH_BARE_ROUTE === '1') mountBenchBareRoute(app)
  for (const { basePath, router } of apiRouters) app.use(basePath, router)
  app.use('/api', notFoundHandler)

  const dist = resolve(env.CLIENT_DIST)
  if (existsSync(dist)) {
    app.use(express.static(dist, { index: false, maxAge: '1h' }))
    // The client routes in the browser: every other GET answers the app shell.
    app.get(/.*/, (_req, res) => res.sendFile(resolve(dist, 'index.html')))
  }
  app.use(notFoundHandler)
  app.use(errorHandler)
  return app
}
