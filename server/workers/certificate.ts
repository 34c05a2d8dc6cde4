/**
 * The sign-off certificate's PDF, set in a worker thread: font subsetting and layout stay off the
 * request loop, and so does reading the input the decision was made from (megabytes of JSON for an
 * imported history) for its final tests.
 */
import { finalReadings } from '#shared/sign-off/plan'
import { signedInput } from '#server/domain/sign-off/signed-record'
import { renderCertificate, type CertificateFacts, type CertificateFonts } from '#server/utils/certificate'
import { workerConnection } from './connection'

export interface CertificateTask {
  /** Everything printed but the final tests, which come from the signed input of `signOffId`. */
  facts: Omit<CertificateFacts, 'finals'>
  fonts: CertificateFonts
  dbPath: string
  signOffId: string
}

export function certificatePdf(task: CertificateTask): Promise<Uint8Array> {
  // What was signed stays signed: the final tests of the input kept with the decision, never the live tank's.
  const input = signedInput(workerConnection(task.dbPath), task.signOffId)
  return renderCertificate({ ...task.facts, finals: input ? finalReadings(input) : [] }, task.fonts)
}
