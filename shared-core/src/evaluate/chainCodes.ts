/**
 * The diagnostic codes of the design chain (references between states, `supply`, mixes by total
 * and remainder), each with its severity, meaning and fix — the rows docs/notation.md lists.
 * Kept in this one table until the evaluator's code registry takes them over.
 */
export const CHAIN_CODES = {
  'bad-reference': {
    severity: 'error',
    meaning: 'a property reference that cannot be used: a key that cannot be referenced, a property of another kind (w=OA.db), a difference in the wrong unit, a reference where only a figure is accepted, or more references than a state has defining properties',
    fix: 'refer to db, wb, dp, rh, w or h of a state above, of the same kind as the key it sets; write a difference as +0.8K, +1.5F, +0.5g/kg or +2kJ/kg',
  },
  'supply-infeasible': {
    severity: 'error',
    meaning: 'a supply state that cannot carry the room loads: the humidity ratio the latent load needs is negative or above saturation, the supply temperature is not below the room for a cooling load, or the flow is not positive',
    fix: 'lower the supply temperature or raise the flow; check the loads and their signs',
  },
  'mix-rest': {
    severity: 'error',
    meaning: 'a mix by total and remainder that does not add up: no total= or more than one rest stream, a total of another kind than the streams, or given streams that leave nothing (or less than nothing) for the rest',
    fix: 'write one stream as rest and the total as total=; make the total larger than the streams given',
  },
} as const;

/** A code of {@link CHAIN_CODES}. */
export type ChainCode = keyof typeof CHAIN_CODES;
