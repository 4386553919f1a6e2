/** Directives of the Forecatch Content-Security-Policy, each `[name, ...sources]`. */
export declare const CSP_DIRECTIVES: string[][];
/** The policy as an HTTP header value. */
export declare const CONTENT_SECURITY_POLICY: string;
/** The policy for a `<meta http-equiv="Content-Security-Policy">` element. */
export declare const CONTENT_SECURITY_POLICY_META: string;
