/** For tests of the sign-off commands: the refusal a command throws. */
import { SignOffRefused } from '../../server/domain/sign-off/refusal'

/** The refusal a command throws, or a failure if it throws something else or nothing. */
export function refusalOf(run: () => unknown): SignOffRefused {
  try {
    run()
  }
  catch (error) {
    if (error instanceof SignOffRefused) return error
    throw error
  }
  throw new Error('the command was not refused')
}
