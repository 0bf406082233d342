import pino from 'pino'
import { env } from '../config/env'

/** Passwords and tokens never reach the log. */
export const logger = pino({
  level: env.NODE_ENV === 'test' && !process.env.LOG_LEVEL ? 'silent' : env.LOG_LEVEL,
  redact: {
    paths: ['req.headers.authorization', 'req.headers.cookie', '*.password', '*.newPassword', 'password'],
    censor: '[hidden]',
  },
})
