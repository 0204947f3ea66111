/**
 * The version of what the engine derives from an input file. Stored with every derived import
 * (`engineVersion`), so that a stored import made by an older engine is read again from the
 * stored file instead of being trusted. Raise it whenever a change to the engine changes what an
 * import gives for the same bytes and options (a new column spelling, a unit rule, a row check).
 */
export const ENGINE_VERSION = '2026.12.2';
