/** Repository root. */
export declare const ROOT: string;
/** Absolute path of Electron's runtime executable when installed, else null (never requires `electron`). */
export declare function electronRuntimePath(): string | null;
/** Builds the renderer into dist/; returns the folder. */
export declare function buildRenderer(opts?: { quiet?: boolean }): Promise<string>;
/** Builds dist-electron/main.cjs and preload.cjs; returns the folder. */
export declare function buildElectron(opts?: { quiet?: boolean }): Promise<string>;
