import { api } from './client'
import { downloadFile, uploadFile, type ProgressListener } from './transfer'
import type {
  CsvImportReport,
  EquipmentItemBody,
  EquipmentItemDto,
  EquipmentKind,
  EquipmentListFilter,
  Page,
} from './types'

const at = (id: string) => `/equipment/${encodeURIComponent(id)}`

export const equipmentApi = {
  list: (query: EquipmentListFilter) => api.get<Page<EquipmentItemDto>>('/equipment', { ...query }),
  get: (id: string) => api.get<{ item: EquipmentItemDto }>(at(id)).then((answer) => answer.item),
  create: (body: EquipmentItemBody) => api.post<{ item: EquipmentItemDto }>('/equipment', body).then((answer) => answer.item),
  update: (id: string, body: EquipmentItemBody, version: number) =>
    api.request<{ item: EquipmentItemDto }>('PUT', at(id), { body: { ...body, version } }).then((answer) => answer.item),
  remove: (id: string, version: number) => api.request<void>('DELETE', at(id), { query: { version } }),
  exportCsv: (kind: EquipmentKind) => downloadFile(`/equipment/csv/${kind}`, `equipment-${kind}.csv`),
  importCsv: (kind: EquipmentKind, file: File, mode: CsvImportReport['mode'], onProgress: ProgressListener) =>
    uploadFile<CsvImportReport>(`/equipment/csv/${kind}?mode=${mode}`, file, {}, onProgress),
  attachDatasheet: (id: string, version: number, file: File, onProgress: ProgressListener) =>
    uploadFile<{ item: EquipmentItemDto }>(`${at(id)}/datasheet`, file, { version: String(version) }, onProgress).then((answer) => answer.item),
  downloadDatasheet: (item: EquipmentItemDto) => downloadFile(`${at(item.id)}/datasheet`, item.datasheet?.fileName ?? 'datasheet.pdf'),
}
