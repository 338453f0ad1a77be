import bcrypt from 'bcryptjs'

/** Work for a password thread: bcrypt runs here so sign-ins never hold up the API's event loop. */
export type PasswordTask = { kind: 'hash'; password: string; cost: number } | { kind: 'verify'; password: string; hash: string }

export default function runPasswordTask(task: PasswordTask): string | boolean {
  return task.kind === 'hash' ? bcrypt.hashSync(task.password, task.cost) : bcrypt.compareSync(task.password, task.hash)
}
