/**
 * The notation's words as data: the one key table (`./keys`) and the one diagnostic-code registry
 * (`./codes`). The layer's entry point.
 */
export * from './keys';
export * from './codes';
