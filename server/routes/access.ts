import type { Role } from '../../shared/auth/roles'

/** Who may change each part of the workspace (see the architecture guide); every member reads it. */
export const PROJECT_EDITORS: readonly Role[] = ['admin', 'designer']
export const EQUIPMENT_EDITORS: readonly Role[] = ['admin', 'designer']
export const JURISDICTION_EDITORS: readonly Role[] = ['admin', 'coordinator']
