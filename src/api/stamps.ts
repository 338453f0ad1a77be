import type { StampCredentialsDto } from '@shared/schemas/stamp'
import { api } from './client'
import { fetchBlob, uploadFile, type ProgressListener } from './transfer'

/** The signed-in reviewer's stamp image and signing certificate (reviewer only). */
export const stampsApi = {
  credentials: () => api.get<StampCredentialsDto>('/profile/stamp'),
  image: () => fetchBlob('/profile/stamp/image', 'image/png'),
  /** 415 not a PNG, 413 too large, 422 wrong pixel size: each names the field `file`. */
  uploadImage: (file: File, onProgress: ProgressListener) => uploadFile<StampCredentialsDto>('/profile/stamp/image', file, {}, onProgress),
  /** 415 not a PKCS#12 (`file`), 422 wrong password (`password`) or expired (`file`). The password is not kept. */
  uploadCertificate: (file: File, password: string, onProgress: ProgressListener) =>
    uploadFile<StampCredentialsDto>('/profile/stamp/certificate', file, { password }, onProgress),
}
