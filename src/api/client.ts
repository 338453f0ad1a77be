import { createApiClient } from './http'

/** The one client the app uses; the auth store connects its session to it. */
export const api = createApiClient()
