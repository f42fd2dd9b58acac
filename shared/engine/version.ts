/** Version of the load engine; stored beside every set of results so recomputation can be audited. */
export const ENGINE_VERSION = '1.2.0';
