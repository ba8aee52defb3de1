import v8 from 'node:v8';

/**
 * Switches on V8's linear-time regular-expression engine (the `l` flag) for this process, so a
 * lead's naming pattern can never make a name check take time exponential in the name's length
 * (shared/naming/linear-regex.ts). V8 flags cannot be given in NODE_OPTIONS; setting it here, on
 * import, comes before any pattern is compiled, since patterns are compiled only when a request
 * reads the naming convention.
 */
v8.setFlagsFromString('--enable-experimental-regexp-engine');
