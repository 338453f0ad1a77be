/** The profile fields a stamp needs, as the server names them in `problems` and 422 answers, in words. */
export const STAMP_PROFILE_FIELD_LABELS: Record<string, string> = {
  stampImage: 'Stamp image',
  certificate: 'Signing certificate',
  licenceNumber: 'Licence number',
  licenceRegion: 'Licence region',
  licenceExpiry: 'Licence expiry',
}
