// The Content-Security-Policy of every Forecatch page, declared once: the Electron session sends it as a
// header, the static server of the browser build sends it as a header, and the build writes it into
// index.html as a <meta> (without frame-ancestors, which a <meta> cannot carry).
// No remote origin anywhere, no eval; plotly.js sets inline styles, so styles allow 'unsafe-inline'
// (scripts never do). Images allow data:/blob: because figure export rasterises the plot's SVG.

/** Directives, in order. */
export const CSP_DIRECTIVES = [
  ["default-src", "'self'"],
  ["script-src", "'self'"],
  ["style-src", "'self'", "'unsafe-inline'"],
  ["img-src", "'self'", "data:", "blob:"],
  ["font-src", "'self'", "data:"],
  ["connect-src", "'self'"],
  ["worker-src", "'self'"],
  ["object-src", "'none'"],
  ["base-uri", "'none'"],
  ["form-action", "'none'"],
  ["frame-ancestors", "'none'"],
];

/** The policy as an HTTP header value. */
export const CONTENT_SECURITY_POLICY = CSP_DIRECTIVES.map((d) => d.join(' ')).join('; ');

/** The policy for a <meta http-equiv> element (frame-ancestors is only honoured in a header). */
export const CONTENT_SECURITY_POLICY_META = CSP_DIRECTIVES.filter((d) => d[0] !== 'frame-ancestors')
  .map((d) => d.join(' '))
  .join('; ');
