import type { AuthUser } from './auth-user'

declare global {
  namespace Express {
    // passport types req.user as Express.User; ours is the AuthUser loaded per request
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends AuthUser {}
  }
}
