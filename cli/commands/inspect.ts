/**
 * `forecatch inspect FILE [--json]`: what a recording file holds, without analysing it.
 */
import { parseFlags, type CliCommand } from '../command';
import { readRecordingFile } from '../io/readRecordingFile';
import { parseImportTemplate } from '../../shared/io/importTemplate';
import { summarizeRecording, type RecordingSummary } from '../../shared/io/summarizeRecording';
import { readFile } from 'node:fs/promises';

function fmt(v: number | null, unit = ''): string {
  return v === null ? '-' : `${Number(v.toPrecision(10))}${unit}`;
}

/**
 * Human-readable lines of a summary.
 * @param s - the summary
 * @returns the text, without a final newline
 */
export function formatSummary(s: RecordingSummary): string {
  const out: string[] = [];
  out.push(`file        ${s.source}`);
  out.push(`format      ${s.format}${s.variant ? ` (${s.variant})` : ''}${s.processorType ? `, processor ${s.processorType}` : ''}`);
  out.push(`time        start ${fmt(s.startS, ' s')}, duration ${fmt(s.durationS, ' s')}`);
  if (s.markers.length > 0) {
    out.push(`markers     ${s.markers.length} at ${fmt(s.pointRateHz, ' Hz')}, frames ${s.firstFrame}-${s.lastFrame} (${s.frames})`);
    const w = Math.max(...s.markers.map((l) => l.length));
    for (const l of s.markers) out.push(`  ${l.padEnd(w)}  missing ${s.missingSamplesByMarker[l] ?? 0}`);
  } else out.push('markers     none');
  if (s.channels.length > 0) {
    out.push(`channels    ${s.channels.length}${s.analogRateHz !== null ? ` at ${fmt(s.analogRateHz, ' Hz')}` : ''}`);
    const w = Math.max(...s.channels.map((c) => c.label.length));
    for (const c of s.channels) {
      out.push(`  ${c.label.padEnd(w)}  ${(c.units || '-').padEnd(6)} ${fmt(c.rateHz, ' Hz')}, ${c.samples} samples${c.explicitTimes ? ', explicit times' : ''}`);
    }
  } else out.push('channels    none');
  out.push(`events      ${s.events.length}`);
  for (const e of s.events) out.push(`  ${fmt(e.timeS, ' s').padEnd(12)} ${e.label}${e.context ? ` [${e.context}]` : ''}${e.durationS !== undefined ? ` (${e.durationS} s)` : ''}`);
  for (const w of s.warnings) out.push(`warning     ${w.code}: ${w.message}`);
  return out.join('\n');
}

/** `forecatch inspect`: prints a recording's summary as text or one JSON object. */
export const command: CliCommand = {
  name: 'inspect',
  summary: 'show what a recording file (C3D, EDF/BDF, CSV/TSV) holds',
  help: [
    'usage: forecatch inspect FILE [--json] [--template TEMPLATE.json]',
    '',
    'Prints the format and variant (C3D processor type and integer/float storage, EDF+/BDF+ continuity,',
    'delimiter), marker labels with the number of missing samples, channel labels with units and rates,',
    'the frame range and counts, events and import warnings.',
    '',
    '  --json                one JSON object instead of text',
    '  --template FILE       import template (column mapping) for delimited text',
    '',
    'Exit status 1 with one line on stderr when the file cannot be read.',
  ].join('\n'),
  async run(args: string[]): Promise<number> {
    const { flags, positionals } = parseFlags(args, ['json']);
    if (positionals.length !== 1) {
      process.stderr.write('forecatch inspect: expected one FILE (see forecatch inspect --help)\n');
      return 2;
    }
    const templatePath = flags.get('template');
    const template = typeof templatePath === 'string' ? parseImportTemplate(await readFile(templatePath, 'utf8'), templatePath) : undefined;
    const rec = await readRecordingFile(positionals[0], { template });
    const summary = summarizeRecording(rec);
    process.stdout.write((flags.get('json') ? JSON.stringify(summary) : formatSummary(summary)) + '\n');
    return 0;
  },
};
