import { api } from './api'
import type { LoginBody, LoginResponse, SessionUser } from '@shared/api/auth'
import type { z } from 'zod'
import type { unitPreferencesSchema } from '@shared/api/auth'

export type UnitPreferences = z.infer<typeof unitPreferencesSchema>

export const authApi = {
  login: (body: LoginBody) => api.post<LoginResponse>('/api/auth/login', body),
  me: () => api.get<{ user: SessionUser }>('/api/auth/me'),
  setPreferences: (body: UnitPreferences) =>
    api.patch<{ user: SessionUser }>('/api/auth/me/preferences', body),
}
