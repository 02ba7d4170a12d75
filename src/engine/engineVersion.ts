/** Version of the numerical engine; bump when any computed number may change. */
export const ENGINE_VERSION = "1.4.0";
/** Relative accuracy the engine promises for every integral-based quantity. */
export const ENGINE_TOLERANCE = 1e-10;
