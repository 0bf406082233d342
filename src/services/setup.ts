/** The Setup area's endpoints (shared/api/setup.ts), typed once here for every view. */
import type { z } from 'zod'
import { api } from './api'
import type {
  contactSchema,
  createCustomerSchema,
  createInstrumentSchema,
  createSpecSchema,
  createUserSchema,
  CustomerRow,
  InstrumentRow,
  PlantSettings,
  SpecDetail,
  SpecRow,
  SpecVersionRow,
  updateContactSchema,
  updateCustomerSchema,
  updateInstrumentSchema,
  updateSpecSchema,
  updateUserSchema,
  UserRow,
} from '@shared/api/setup'

type In<S extends z.ZodType> = z.input<S>

export const usersApi = {
  list: () => api.get<UserRow[]>('/api/users'),
  create: (body: In<typeof createUserSchema>) => api.post<UserRow>('/api/users', body),
  update: (id: number, body: In<typeof updateUserSchema>) =>
    api.patch<UserRow>(`/api/users/${id}`, body),
  resetPassword: (id: number, password: string) =>
    api.post<UserRow>(`/api/users/${id}/reset-password`, { password }),
}

export const customersApi = {
  list: () => api.get<CustomerRow[]>('/api/customers'),
  get: (id: number) => api.get<CustomerRow>(`/api/customers/${id}`),
  create: (body: In<typeof createCustomerSchema>) => api.post<CustomerRow>('/api/customers', body),
  update: (id: number, body: In<typeof updateCustomerSchema>) =>
    api.patch<CustomerRow>(`/api/customers/${id}`, body),
  addContact: (id: number, body: In<typeof contactSchema>) =>
    api.post<CustomerRow>(`/api/customers/${id}/contacts`, body),
  updateContact: (id: number, contactId: number, body: In<typeof updateContactSchema>) =>
    api.patch<CustomerRow>(`/api/customers/${id}/contacts/${contactId}`, body),
}

export const specsApi = {
  list: () => api.get<SpecRow[]>('/api/specs'),
  get: (id: number) => api.get<SpecDetail>(`/api/specs/${id}`),
  version: (id: number, version: number) =>
    api.get<SpecVersionRow>(`/api/specs/${id}/versions/${version}`),
  create: (body: In<typeof createSpecSchema>) => api.post<SpecDetail>('/api/specs', body),
  update: (id: number, body: In<typeof updateSpecSchema>) =>
    api.put<SpecDetail>(`/api/specs/${id}`, body),
}

export const instrumentsApi = {
  list: () => api.get<InstrumentRow[]>('/api/instruments'),
  create: (body: In<typeof createInstrumentSchema>) =>
    api.post<InstrumentRow>('/api/instruments', body),
  update: (id: number, body: In<typeof updateInstrumentSchema>) =>
    api.patch<InstrumentRow>(`/api/instruments/${id}`, body),
}

export const settingsApi = {
  get: () => api.get<PlantSettings>('/api/settings'),
  put: (body: PlantSettings) => api.put<PlantSettings>('/api/settings', body),
}
