import type { Role } from '@shared/auth/roles'

/** What each role does in Stringline, in the words shown on its home page. */
export const ROLE_DUTIES: Record<Role, readonly string[]> = {
  admin: [
    'Add the members of your organisation, give each a role and switch accounts off when people leave.',
    'Record each reviewing electrician’s licence number, region and expiry, which their stamp carries.',
    'Read every project, design and permit set of the organisation.',
    'Keep the organisation’s settings and read the audit log of who changed what.',
  ],
  designer: [
    'Set up projects: site, jurisdiction and the chosen modules, inverters and balance of system.',
    'Build designs and read every NEC calculation step with its formula, numbers and code section.',
    'Keep the equipment library your designs draw from.',
    'Generate draft plan sets, send them to a reviewing electrician and answer their comments.',
  ],
  reviewer: [
    'Read every project, design and calculation of the organisation.',
    'Comment on a revision, request changes, or approve and stamp it with your licence.',
    'A stamp stays with the revision you approved; a later edit starts a new draft.',
    'Keep your licence number, region and expiry current: ask an administrator to update them.',
  ],
  coordinator: [
    'Keep jurisdiction profiles: adopted code editions, local amendments and sheet size.',
    'Submit stamped plan sets to the AHJ and record permit numbers and fees.',
    'Log correction letters and resubmissions until the permit is issued.',
    'Download submission packages for the AHJ portal or counter.',
  ],
}
