/** One subcommand of the `forecatch` command line. */
export interface CliCommand {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Full help text for `forecatch NAME --help`. */
  help: string;
  /** Runs with the arguments after the command name; returns the exit status. */
  run(args: string[]): Promise<number>;
}

/** Minimal flag parser: `--name value`, `--name=value`, `--flag` (boolean); the rest are positionals. */
export function parseFlags(
  args: string[],
  booleanFlags: readonly string[] = [],
): { flags: Map<string, string | true>; positionals: string[] } {
  const flags = new Map<string, string | true>();
  const positionals: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      if (eq > 0) flags.set(a.slice(2, eq), a.slice(eq + 1));
      else {
        const key = a.slice(2);
        if (booleanFlags.includes(key) || i + 1 >= args.length || args[i + 1].startsWith('--')) flags.set(key, true);
        else flags.set(key, args[++i]);
      }
    } else positionals.push(a);
  }
  return { flags, positionals };
}
