import { existsSync, readFileSync } from 'node:fs'
import { z } from 'zod'

/** Refuse any address but loopback: Filmtrail never listens on a network interface by itself. */
const loopback = z
  .string()
  .refine((h) => h === 'localhost' || h === '::1' || /^127\.\d+\.\d+\.\d+$/.test(h), {
    message: 'HOST must be a loopback address (127.x.x.x, ::1 or localhost)',
  })

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: loopback.default('127.0.0.1'),
  PORT: z.coerce.number().int().min(1).max(65535).default(5180),
  DATABASE_URL: z.string().url().default('postgres://postgres@127.0.0.1:54329/filmtrail'),
  DB_POOL_MAX: z.coerce.number().int().min(1).max(100).default(10),
  JWT_SECRET: z.string().min(32).optional(),
  JWT_SECRET_FILE: z.string().optional(),
  JWT_TTL_SECONDS: z.coerce.number().int().min(60).default(12 * 3600),
  SMTP_HOST: loopback.default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  MAIL_FROM: z.string().default('Filmtrail certificates <certificates@harrowgate.example>'),
  MAILBOX_URL: z.string().default('http://127.0.0.1:2580'),
  PUBLIC_URL: z.string().url().default('http://127.0.0.1:5180'),
  UPLOAD_MAX_BYTES: z.coerce.number().int().min(1024).default(10 * 1024 * 1024),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  CLIENT_DIST: z.string().default('dist'),
  OUTBOX_POLL_MS: z.coerce.number().int().min(50).default(2000),
  LOGIN_RATE_LIMIT: z.coerce.number().int().min(1).default(10),
})

function loadJwtSecret(env: z.infer<typeof envSchema>): string {
  if (env.JWT_SECRET) return env.JWT_SECRET
  if (env.JWT_SECRET_FILE && existsSync(env.JWT_SECRET_FILE)) {
    const secret = readFileSync(env.JWT_SECRET_FILE, 'utf8').trim()
    if (secret.length >= 32) return secret
  }
  throw new Error(
    'No JWT secret: set JWT_SECRET (32+ characters) or JWT_SECRET_FILE to a file holding one. ' +
      'The start script (npm start) generates one under .data/ on first run.',
  )
}

function parseEnv() {
  const parsed = envSchema.safeParse(process.env)
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`)
    throw new Error(`Configuration is invalid:\n${lines.join('\n')}`)
  }
  return { ...parsed.data, jwtSecret: loadJwtSecret(parsed.data) }
}

export const env = parseEnv()
export type Env = typeof env
