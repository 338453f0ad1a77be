import { z } from 'zod'
import { certificateUploadBody, fileVerificationDto, stampCredentialsDto, verifiedStampDto } from '../../shared/schemas/stamp'
import { publicLookupRateLimit } from '../http/rate-limits'
import { Download, route } from '../http/route'

/** Only the licensed reviewer stamps, with their own image and key: nobody else manages them. */
const STAMP_HOLDERS = ['reviewer'] as const

export const stampRoutes = [
  route({
    method: 'get',
    path: '/api/profile/stamp',
    access: STAMP_HOLDERS,
    summary: 'The stamp image, signing certificate and licence on the signed-in reviewer’s profile, and what still blocks stamping',
    response: stampCredentialsDto,
    handler: ({ user, services }) => services.stamps.credentials(user!),
  }),
  route({
    method: 'get',
    path: '/api/profile/stamp/image',
    access: STAMP_HOLDERS,
    summary: 'The signed-in reviewer’s stamp image (PNG)',
    handler: async ({ user, services }) => new Download(await services.stamps.stampImage(user!), 'image/png', 'stamp.png', 'inline'),
  }),
  route({
    method: 'post',
    path: '/api/profile/stamp/image',
    access: STAMP_HOLDERS,
    summary: 'Upload the stamp image (PNG, 150–4000 px a side, at most 2 MB; the type is read from the content)',
    upload: { field: 'file', description: 'PNG image of the stamp' },
    response: stampCredentialsDto,
    handler: ({ user, file, services }) => services.stamps.uploadStampImage(user!, file),
  }),
  route({
    method: 'post',
    path: '/api/profile/stamp/certificate',
    access: STAMP_HOLDERS,
    summary: 'Upload the signing certificate (PKCS#12 with its private key) and its password, which opens it once and is not kept',
    upload: { field: 'file', description: 'PKCS#12 file (.p12 or .pfx)' },
    body: certificateUploadBody,
    response: stampCredentialsDto,
    handler: ({ user, file, body, services }) => services.stamps.uploadCertificate(user!, file, body.password),
  }),
  route({
    method: 'get',
    path: '/api/verify/:code',
    access: 'public',
    summary: 'Public: the stamp a verification id names (project code, revision, stamp holder, date), or 404',
    beforeBody: [publicLookupRateLimit('verify-id')],
    params: z.object({ code: z.string().max(40) }),
    response: verifiedStampDto,
    handler: ({ params, services }) => services.stamps.verifyCode(params.code),
  }),
  route({
    method: 'post',
    path: '/api/verify',
    access: 'public',
    summary: 'Public: check an uploaded PDF — is its signature intact, and which stamped revision is it? Nothing is stored',
    beforeBody: [publicLookupRateLimit('verify-file')],
    upload: { field: 'file', description: 'The PDF to check' },
    response: fileVerificationDto,
    handler: ({ file, services }) => services.stamps.verifyFile(file),
  }),
]
