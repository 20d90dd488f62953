import { EngineError } from '../../shared/domain/errors'

/** The EngineError code a call throws, or undefined when it does not throw; other errors fail the test. */
export function engineErrorCode(fn: () => unknown): string | undefined {
  try {
    fn()
  } catch (e) {
    if (e instanceof EngineError) return e.code
    throw e
  }
  return undefined
}
