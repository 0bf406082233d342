import { z } from 'zod'
import type { Role } from './roles'

export const loginSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address').max(200),
  password: z.string().min(1, 'Enter your password').max(200),
})
export type LoginBody = z.infer<typeof loginSchema>

/** Password policy, shared so the form and the server say the same thing. */
export const PASSWORD_MIN_LENGTH = 10
export const passwordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(200, 'Use at most 200 characters')
  .refine((p) => /[A-Za-z]/.test(p) && /[0-9]/.test(p), 'Use letters and at least one digit')

export interface SessionUser {
  id: number
  email: string
  name: string
  role: Role
  customerId: number | null
  thicknessUnit: 'um' | 'mil'
  temperatureUnit: 'C' | 'F'
  areaUnit: 'm2' | 'ft2'
}

export interface LoginResponse {
  token: string
  user: SessionUser
}

export const unitPreferencesSchema = z.object({
  thicknessUnit: z.enum(['um', 'mil']).optional(),
  temperatureUnit: z.enum(['C', 'F']).optional(),
  areaUnit: z.enum(['m2', 'ft2']).optional(),
})
