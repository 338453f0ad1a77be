import { api } from './client'
import type { CreateJurisdictionBody, JurisdictionDto, JurisdictionListFilter, Page, UpdateJurisdictionBody } from './types'

const at = (id: string) => `/jurisdictions/${encodeURIComponent(id)}`

export const jurisdictionsApi = {
  list: (query: JurisdictionListFilter) => api.get<Page<JurisdictionDto>>('/jurisdictions', { ...query }),
  get: (id: string) => api.get<{ jurisdiction: JurisdictionDto }>(at(id)).then((answer) => answer.jurisdiction),
  create: (body: CreateJurisdictionBody) =>
    api.post<{ jurisdiction: JurisdictionDto }>('/jurisdictions', body).then((answer) => answer.jurisdiction),
  update: (id: string, body: UpdateJurisdictionBody) =>
    api.patch<{ jurisdiction: JurisdictionDto }>(at(id), body).then((answer) => answer.jurisdiction),
  remove: (id: string, version: number) => api.request<void>('DELETE', at(id), { query: { version } }),
}
