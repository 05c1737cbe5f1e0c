/** Small helpers shared by the physics tests. */
import { PsychroError, type PhysicsCode } from '../../src/physics';

/** The stable code a call throws (a {@link PsychroError}), or 'no error'; anything else rethrows. */
export function codeOf(f: () => unknown): PhysicsCode | 'no error' {
  try {
    f();
    return 'no error';
  } catch (e) {
    if (e instanceof PsychroError) return e.code;
    throw e;
  }
}
