export { CertificateError, createDemoCertificate, readCertificate, type CertificateInfo, type CertificateProblem } from './certificate'
export { signPdf, type SignatureDetails } from './sign-pdf'
export { verifyPdfSignature, type SignatureCheck, type SignatureState } from './verify-pdf'
