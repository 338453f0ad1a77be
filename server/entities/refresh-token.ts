import { EntitySchema } from 'typeorm'

/**
 * A refresh token, stored only as its SHA-256 hash. Tokens rotate on every use; all tokens issued
 * from one sign-in share a family, and reuse of a rotated token revokes the whole family.
 */
export interface RefreshToken {
  id: string
  userId: string
  familyId: string
  tokenHash: string
  expiresAt: Date
  revokedAt: Date | null
  createdAt: Date
}

export const RefreshTokenEntity = new EntitySchema<RefreshToken>({
  name: 'RefreshToken',
  tableName: 'refresh_tokens',
  columns: {
    id: { type: 'uuid', primary: true, generated: 'uuid' },
    userId: { name: 'user_id', type: 'uuid' },
    familyId: { name: 'family_id', type: 'uuid' },
    tokenHash: { name: 'token_hash', type: 'text', unique: true },
    expiresAt: { name: 'expires_at', type: 'timestamptz' },
    revokedAt: { name: 'revoked_at', type: 'timestamptz', nullable: true },
    createdAt: { name: 'created_at', type: 'timestamptz', createDate: true },
  },
})
