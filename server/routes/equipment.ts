import { z } from 'zod'
import { ANY_ROLE } from '../../shared/auth/roles'
import {
  csvImportAnswer,
  csvImportReport,
  EQUIPMENT_KINDS,
  equipmentItemBody,
  equipmentItemDto,
  equipmentListQuery,
  updateEquipmentBody,
} from '../../shared/schemas/equipment'
import { Download, pageResponse, Reply, route } from '../http/route'
import { EQUIPMENT_EDITORS } from './access'

const idParams = z.object({ id: z.string() })
const kindParams = z.object({ kind: z.enum(EQUIPMENT_KINDS) })
const versionQuery = z.object({ version: z.coerce.number().int().min(1) })
const oneItem = z.object({ item: equipmentItemDto })

export const equipmentRoutes = [
  route({
    method: 'get',
    path: '/api/equipment',
    access: ANY_ROLE,
    summary: 'The equipment library, paged, searchable by manufacturer, model and notes, filtered by kind',
    query: equipmentListQuery,
    response: pageResponse(equipmentItemDto),
    handler: ({ user, query, services }) => services.equipment.list(user!.organizationId, query),
  }),
  route({
    method: 'post',
    path: '/api/equipment',
    access: EQUIPMENT_EDITORS,
    summary: 'Add an item to the library; the answer carries plausibility warnings',
    body: equipmentItemBody,
    response: oneItem,
    handler: async ({ user, body, services }) => new Reply(201, { item: await services.equipment.create(user!, body) }),
  }),
  route({
    method: 'get',
    path: '/api/equipment/:id',
    access: ANY_ROLE,
    summary: 'One library item with its plausibility warnings',
    params: idParams,
    response: oneItem,
    handler: async ({ user, params, services }) => ({ item: await services.equipment.get(user!.organizationId, params.id) }),
  }),
  route({
    method: 'put',
    path: '/api/equipment/:id',
    access: EQUIPMENT_EDITORS,
    summary: 'Replace a library item at the version read (its kind stays)',
    params: idParams,
    body: updateEquipmentBody,
    response: oneItem,
    handler: async ({ user, params, body, services }) => ({ item: await services.equipment.update(user!, params.id, body) }),
  }),
  route({
    method: 'delete',
    path: '/api/equipment/:id',
    access: EQUIPMENT_EDITORS,
    summary: 'Remove a library item at the version read; designs keep their own copies',
    params: idParams,
    query: versionQuery,
    handler: ({ user, params, query, services }) => services.equipment.remove(user!, params.id, query.version),
  }),
  route({
    method: 'get',
    path: '/api/equipment/csv/:kind',
    access: ANY_ROLE,
    summary: 'Every library item of one kind as CSV, in the format the import reads',
    params: kindParams,
    handler: async ({ user, params, services }) =>
      new Download(await services.equipment.exportCsv(user!.organizationId, params.kind), 'text/csv; charset=utf-8', `equipment-${params.kind}.csv`),
  }),
  route({
    method: 'post',
    path: '/api/equipment/csv/:kind',
    access: EQUIPMENT_EDITORS,
    summary: 'Import items of one kind from CSV with a per-row report; by default a file with any bad row imports nothing',
    params: kindParams,
    query: z.object({ mode: csvImportReport.shape.mode.default('all_or_nothing') }),
    response: csvImportAnswer,
    upload: { field: 'file', description: 'CSV file (UTF-8) with a header row' },
    handler: ({ user, params, query, file, services }) => services.equipment.importCsv(user!, params.kind, file, query.mode),
  }),
  route({
    method: 'post',
    path: '/api/equipment/:id/datasheet',
    access: EQUIPMENT_EDITORS,
    summary: 'Attach a PDF datasheet to an item at the version read (PDF by content only; size-limited)',
    params: idParams,
    body: z.object({ version: z.coerce.number().int().min(1) }),
    upload: { field: 'file', description: 'PDF datasheet' },
    response: oneItem,
    handler: async ({ user, params, body, file, services }) => ({ item: await services.equipment.attachDatasheet(user!, params.id, body.version, file) }),
  }),
  route({
    method: 'get',
    path: '/api/equipment/:id/datasheet',
    access: ANY_ROLE,
    summary: 'Download the datasheet of an item',
    params: idParams,
    handler: async ({ user, params, services }) => {
      const sheet = await services.equipment.datasheet(user!.organizationId, params.id)
      return new Download(sheet.bytes, sheet.mediaType, sheet.fileName)
    },
  }),
]
