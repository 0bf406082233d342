import type { Router } from 'express'
import { authRouter } from './auth/auth.router'
import { healthRouter } from './health/health.router'
import { usersRouter } from './users/users.router'
import { customersRouter } from './customers/customers.router'
import { specsRouter } from './specs/specs.router'
import { instrumentsRouter } from './instruments/instruments.router'
import { settingsRouter } from './settings/settings.router'
import { lotsRouter } from './lots/lots.router'
import { partsRouter } from './parts/parts.router'
import { partReadingsRouter, readingsRouter } from './readings/readings.router'
import { verificationsRouter } from './verifications/verifications.router'
import { photosRouter } from './photos/photos.router'
import { trendsRouter } from './trends/trends.router'
import { lotReviewRouter, reviewRouter } from './review/review.router'
import { nonconformancesRouter } from './nonconformances/nonconformances.router'
import { defectTypesRouter } from './defect-types/defectTypes.router'
import { auditRouter } from './audit/audit.router'
import { certificatesRouter, lotCertificatesRouter } from './certificates/certificates.router'
import { verifyRouter } from './verify/verify.router'

/** Every feature's router, mounted at its base path by app.ts. Add a feature here. */
export const apiRouters: { basePath: string; router: Router }[] = [
  healthRouter,
  authRouter,
  usersRouter,
  customersRouter,
  specsRouter,
  instrumentsRouter,
  settingsRouter,
  lotsRouter,
  partsRouter,
  partReadingsRouter,
  readingsRouter,
  verificationsRouter,
  photosRouter,
  trendsRouter,
  lotReviewRouter,
  reviewRouter,
  nonconformancesRouter,
  defectTypesRouter,
  auditRouter,
  lotCertificatesRouter,
  certificatesRouter,
  verifyRouter,
]
