/** The sign-off certificate's PDF, set in a worker thread: font subsetting and layout stay off the request loop. */
import { renderCertificate, type CertificateFacts, type CertificateFonts } from '#server/utils/certificate'

export interface CertificateTask {
  facts: CertificateFacts
  fonts: CertificateFonts
}

export function certificatePdf(task: CertificateTask): Promise<Uint8Array> {
  return renderCertificate(task.facts, task.fonts)
}
