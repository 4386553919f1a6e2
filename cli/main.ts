/**
 * Entry of the `forecatch` command line. Each subcommand lives in cli/commands/<name>.ts and exports
 * `command: CliCommand`; this file only dispatches.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { join } from 'node:path';
import type { CliCommand } from './command';
import { serializeError } from '../shared/errors';

async function loadCommands(): Promise<Map<string, CliCommand>> {
  const dir = fileURLToPath(new URL('./commands', import.meta.url));
  const commands = new Map<string, CliCommand>();
  for (const name of readdirSync(dir).sort()) {
    if (!/\.ts$/.test(name) || name.endsWith('.d.ts')) continue;
    const mod = (await import(pathToFileURL(join(dir, name)).href)) as { command?: CliCommand };
    if (mod.command) commands.set(mod.command.name, mod.command);
  }
  return commands;
}

function usage(commands: Map<string, CliCommand>): string {
  const lines = ['usage: forecatch <command> [options]', '', 'commands:'];
  for (const c of commands.values()) lines.push(`  ${c.name.padEnd(10)} ${c.summary}`);
  lines.push('', 'forecatch <command> --help shows the options of one command.');
  return lines.join('\n');
}

/** Runs the command line; returns the process exit status. */
export async function run(argv: string[]): Promise<number> {
  const commands = await loadCommands();
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h' || name === 'help') {
    process.stdout.write(usage(commands) + '\n');
    return name ? 0 : 2;
  }
  if (name === '--version' || name === '-v') {
    const { FORECATCH_VERSION } = await import('../shared/version');
    process.stdout.write(`forecatch ${FORECATCH_VERSION}\n`);
    return 0;
  }
  const command = commands.get(name);
  if (!command) {
    process.stderr.write(`forecatch: unknown command '${name}'\n${usage(commands)}\n`);
    return 2;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    process.stdout.write(command.help + '\n');
    return 0;
  }
  try {
    return await command.run(rest);
  } catch (err) {
    const e = serializeError(err);
    process.stderr.write(`forecatch ${name}: ${e.message.split('\n')[0]}\n`);
    return 1;
  }
}
