import type { Router } from 'express'
import { authRouter } from './auth/auth.router'
import { healthRouter } from './health/health.router'

/** Every feature's router, mounted at its base path by app.ts. Add a feature here. */
export const apiRouters: { basePath: string; router: Router }[] = [healthRouter, authRouter]
