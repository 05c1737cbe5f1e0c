/** The notation's words as data: the one key table (see `./keys`). The layer's entry point. */
export * from './keys';
