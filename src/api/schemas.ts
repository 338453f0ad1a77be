import { createUserBody, loginBody, updateUserBody } from '@shared/schemas/auth'

/* The forms check what the user types with the API's own request schemas. */

export { PASSWORD_MIN_LENGTH } from '@shared/schemas/auth'

export const signInForm = loginBody
export const createUserForm = createUserBody
export const editUserForm = updateUserBody.required().omit({ active: true })
