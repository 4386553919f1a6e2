/** Resolves a URL path inside `root`, or null when it would leave it. */
export declare function resolveInside(root: string, urlPath: string): string | null;
/** Serves `dir` on 127.0.0.1 (port 0 picks a free port); tries the next ports when one is taken. */
export declare function serveStatic(
  dir: string,
  opts?: { port?: number; tries?: number; quiet?: boolean },
): Promise<{ url: string; port: number; close: () => Promise<void> }>;
