/**
 * The heap as the cost tests count it: bytes in use after forced full collections, compiled code
 * left out (it warms up on its own), so that a count does not depend on the machine's speed or load.
 */
import { getHeapSpaceStatistics, setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

setFlagsFromString('--expose-gc');
/** A full collection (the engine's own, exposed for the test files that import this). */
const collect = runInNewContext('gc') as () => void;

/** Bytes in use on the heap after a full collection, without compiled code. */
export function heapBytes(): number {
  collect();
  collect();
  let bytes = 0;
  for (const space of getHeapSpaceStatistics())
    if (!space.space_name.startsWith('code')) bytes += space.space_used_size;
  return bytes;
}
