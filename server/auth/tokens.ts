import { createHash, createSecretKey, randomBytes, type KeyObject } from 'node:crypto'
import jwt from 'jsonwebtoken'
import type { Role } from '../../shared/auth/roles'

/** The only algorithm accepted; pinned on both signing and verifying. */
export const JWT_ALGORITHM = 'HS256'
export const JWT_ISSUER = 'stringline'
export const JWT_AUDIENCE = 'stringline-api'

export interface AccessClaims {
  sub: string
  org: string
  role: Role
}

/**
 * The HMAC key as a KeyObject. Given a string, jsonwebtoken first tries to parse it as a PEM public
 * key and catches the failure on every call: that was a third of an API process's CPU under load.
 */
export function jwtKey(secret: string): KeyObject {
  return createSecretKey(Buffer.from(secret, 'utf8'))
}

export function signAccessToken(claims: AccessClaims, key: KeyObject, ttlSeconds: number): string {
  return jwt.sign({ org: claims.org, role: claims.role }, key, {
    algorithm: JWT_ALGORITHM,
    subject: claims.sub,
    issuer: JWT_ISSUER,
    audience: JWT_AUDIENCE,
    expiresIn: ttlSeconds,
  })
}

/** A new opaque refresh token: 256 random bits. Only its hash is stored. */
export function newRefreshToken(): string {
  return randomBytes(32).toString('base64url')
}

export function hashRefreshToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}
