import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readRecordingFile } from '../../cli/io/readRecordingFile';
import { ForecatchError, ParseError } from '../../shared/errors';
import { readRecording } from '../../shared/io/readRecording';

const dir = mkdtempSync(join(tmpdir(), 'forecatch-io-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('readRecordingFile (Node): streams delimited text, reads binary formats whole', () => {
  it('gives the same recording as the in-memory reader, even with 5-byte stream chunks splitting multi-byte characters', async () => {
    const lines = ['\uFEFFtime_s,Kraft µ [N],Ärm_x,Ärm_y,Ärm_z'];
    for (let i = 0; i < 200; i++) lines.push(`${i / 250},${(i * 0.37) % 5},${i / 1000},0.5,${i % 7 ? 1.25 : ''}`);
    const path = join(dir, 'utf8.csv');
    writeFileSync(path, lines.join('\n'));
    const streamed = await readRecordingFile(path, { chunkBytes: 5 });
    const whole = readRecording('utf8.csv', new Uint8Array(readFileSync(path)));
    expect(streamed.signals[0].label).toBe('Kraft µ');
    expect(streamed.markers!.markers[0].label).toBe('Ärm');
    expect(streamed.markers!.markers[0].z).toEqual(whole.markers!.markers[0].z);
    expect(streamed.signals[0].values).toEqual(whole.signals[0].values);
    expect(streamed.markers!.rateHz).toBe(250);
    expect(streamed.meta.missingSamplesByMarker).toEqual({ Ärm: 29 });
  });

  it('reads an EDF+ file by content', async () => {
    const rec = await readRecordingFile(new URL('../fixtures/io/edflib_emg.edf', import.meta.url).pathname);
    expect(rec.format).toBe('edf+');
    expect(rec.source).toBe('edflib_emg.edf');
  });

  it('reports a missing file and a directory as IO_ERROR, bad content as ParseError', async () => {
    await expect(readRecordingFile(join(dir, 'none.csv'))).rejects.toMatchObject({ code: 'IO_ERROR' });
    await expect(readRecordingFile(dir)).rejects.toBeInstanceOf(ForecatchError);
    const bad = join(dir, 'bad.csv');
    writeFileSync(bad, 'time,a\n0,1\n0,2\n');
    await expect(readRecordingFile(bad)).rejects.toBeInstanceOf(ParseError);
  });
});
