import type { DataSource } from 'typeorm'
import type { Role } from '../../shared/auth/roles'
import { hashPassword } from '../auth/passwords'
import { OrganizationEntity, UserEntity } from '../entities'
import type { FileStorage } from '../storage'
import { giveDemoStampCredentials } from './stamp-credentials'
import { loadDemoWorkspace } from './workspace'

/**
 * Demo data: an invented installer in an invented town. The passwords are for local use only and
 * are printed in the README.
 */
export const DEMO_ORGANIZATION = { slug: 'larkspur-valley-solar', name: 'Larkspur Valley Solar Co.' }
export const DEMO_PASSWORD = 'cedar-hollow-demo'

interface DemoUser {
  email: string
  name: string
  role: Role
  licence?: { number: string; region: string; expiry: string }
}

export const DEMO_USERS: DemoUser[] = [
  { email: 'admin@larkspur-solar.example', name: 'Rowan Ashdown', role: 'admin' },
  { email: 'designer@larkspur-solar.example', name: 'Imani Okafor', role: 'designer' },
  {
    email: 'reviewer@larkspur-solar.example',
    name: 'Teodor Lindqvist',
    role: 'reviewer',
    licence: { number: 'EC-40718 (demo)', region: 'Cedar Hollow County (invented)', expiry: '2028-06-30' },
  },
  { email: 'coordinator@larkspur-solar.example', name: 'Priya Venkataraman', role: 'coordinator' },
]

/**
 * Loads the demo organisation, its users and its workspace (jurisdiction, equipment library,
 * projects with designs) once; later runs find them and change nothing. With `storage`, the demo
 * reviewer also gets a demo stamp image and signing certificate. A database seeded before
 * the workspace existed gets the workspace alone.
 */
export async function seedDemo(db: DataSource, bcryptCost: number, storage?: FileStorage): Promise<'created' | 'present'> {
  return db.transaction(async (manager) => {
    const orgs = manager.getRepository(OrganizationEntity)
    const reviewer = DEMO_USERS.find((u) => u.role === 'reviewer')!
    const stampCredentials = () => (storage ? giveDemoStampCredentials(manager, storage, reviewer.email, DEMO_PASSWORD) : undefined)
    const existing = await orgs.findOneBy({ slug: DEMO_ORGANIZATION.slug })
    if (existing) {
      await stampCredentials()
      return loadDemoWorkspace(manager, existing.id)
    }
    const org = await orgs.save(DEMO_ORGANIZATION)
    const passwordHash = await hashPassword(DEMO_PASSWORD, bcryptCost)
    await manager.getRepository(UserEntity).save(
      DEMO_USERS.map((u) => ({
        organizationId: org.id,
        email: u.email,
        name: u.name,
        role: u.role,
        passwordHash,
        active: true,
        licenceNumber: u.licence?.number ?? null,
        licenceRegion: u.licence?.region ?? null,
        licenceExpiry: u.licence?.expiry ?? null,
      })),
    )
    await stampCredentials()
    await loadDemoWorkspace(manager, org.id)
    return 'created'
  })
}
