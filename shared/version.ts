/** Forecatch's version, written into every output header and the methods paragraph. Keep in step with package.json. */
export const FORECATCH_VERSION = '0.1.0';
