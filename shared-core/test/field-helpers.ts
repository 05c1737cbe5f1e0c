/**
 * Makes an object with `make` and counts the fields `names` that its constructor sets by assignment
 * to a field the object does not have yet (a setter put on the prototype for each catches that).
 * A class field that is defined (not `declare`d) is made an own field, set to undefined, before the
 * constructor runs (a step of its own for every object made), and the constructor's assignment then
 * passes the setter by. Returns the count and the object's own keys, in order.
 */
export function assignedFields(
  proto: object,
  names: readonly string[],
  make: () => object,
): { set: number; keys: string[] } {
  let set = 0;
  for (const name of names) {
    Object.defineProperty(proto, name, {
      configurable: true,
      set(this: object, v: unknown) {
        set++;
        Object.defineProperty(this, name, { value: v, writable: true, enumerable: true, configurable: true });
      },
    });
  }
  try {
    const keys = Object.keys(make());
    return { set, keys };
  } finally {
    for (const name of names) delete (proto as Record<string, unknown>)[name];
  }
}
