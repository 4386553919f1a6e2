import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../shared/errors';
import { detectRecordingFormat } from '../../shared/io/detectRecordingFormat';
import { readRecording } from '../../shared/io/readRecording';
import { writeEdf } from '../../shared/io/edf/writeEdf';

const FIX = new URL('../fixtures/io/', import.meta.url);
const C3D_SAMPLE = '../shared/reference/c3d-org-samples/sample01/Eb015pi.c3d';
const fixture = (name: string) => new Uint8Array(readFileSync(new URL(name, FIX)));
const utf8 = (text: string) => new TextEncoder().encode(text);

describe('readRecording: format detection by content', () => {
  it('EDF+ by its version field, whatever the extension', () => {
    const rec = readRecording('emg.dat', fixture('edflib_emg.edf'));
    expect(rec.format).toBe('edf+');
    expect(detectRecordingFormat('x.csv', fixture('edflib_emg.edf'))).toBe('edf');
  });

  it('BDF+ by 0xFF "BIOSEMI"', () => {
    expect(readRecording('emg', fixture('edflib_emg.bdf')).format).toBe('bdf+');
  });

  it('delimited text decoded as UTF-8 with the byte-order mark stripped', () => {
    const bom = new Uint8Array([0xef, 0xbb, 0xbf, ...utf8('time,Kraft [N]\n0,1\n0.5,2\n')]);
    const rec = readRecording('force.txt', bom);
    expect(rec.format).toBe('delimited');
    expect(rec.signals[0]).toMatchObject({ label: 'Kraft', units: 'N', rateHz: 2 });
  });

  it('reads the CSV fixture in the default layout', () => {
    const rec = readRecording('rail_trial.csv', fixture('rail_trial.csv'));
    expect(rec.markers!.markers.map((m) => m.label)).toEqual(['ball', 'hand']);
    expect(rec.markers!.rateHz).toBe(120);
    expect(rec.meta.missingSamplesByMarker).toEqual({ ball: 0, hand: 3 });
  });

  it.skipIf(!existsSync(C3D_SAMPLE))('C3D by byte 2 = 0x50 with a parameter pointer inside the file (c3d.org sample01; skipped when ../shared/reference is absent)', () => {
    const bytes = new Uint8Array(readFileSync(C3D_SAMPLE));
    expect(detectRecordingFormat('Eb015pi', bytes)).toBe('c3d');
    const rec = readRecording('Eb015pi.c3d', bytes);
    expect(rec.format).toBe('c3d');
    expect(rec.markers!.markers.length).toBe(26);
  });

  it('does not take text starting with "P" (0x50 as second byte) for C3D when the pointer lies outside the file', () => {
    const text = utf8('ZP\n');
    expect(detectRecordingFormat('x', new Uint8Array([200, 0x50, 0, 0]))).not.toBe('c3d');
    expect(detectRecordingFormat('notes.txt', text)).toBe('delimited');
  });

  it('falls back on the extension, and the chosen reader names the problem', () => {
    const e = (() => {
      try {
        readRecording('broken.edf', new Uint8Array(300).fill(0x41));
      } catch (err) {
        return err as ParseError;
      }
    })();
    expect(e).toBeInstanceOf(ParseError);
    expect(e!.byteOffset).toBe(0);
    expect(e!.message).toContain('broken.edf');
  });

  it('refuses unknown binary content and empty files with a ParseError at byte 0', () => {
    expect(() => readRecording('blob.bin', new Uint8Array([1, 0, 2, 3]))).toThrow(ParseError);
    expect(() => readRecording('empty', new Uint8Array(0))).toThrow(/empty file/);
  });

  it('reads what writeEdf wrote', () => {
    const bytes = writeEdf([{ label: 'emg', units: 'mV', rateHz: 100, startS: 0, values: new Float64Array(100).fill(0.5) }]);
    expect(readRecording('sim.edf', bytes).signals[0].rateHz).toBe(100);
  });
});

describe('detectRecordingFormat: the C3D parameter pointer must be sane', () => {
  it('needs the processor byte 84-86 at the parameter section when it lies within the given bytes', () => {
    const b = new Uint8Array(1024);
    b[0] = 2;
    b[1] = 0x50;
    expect(detectRecordingFormat('x', b)).not.toBe('c3d');
    b[512 + 3] = 84;
    expect(detectRecordingFormat('x', b)).toBe('c3d');
    // Only the first bytes at hand (the Node reader passes 4 KB and the file size): pointer checked against the size.
    const head = b.subarray(0, 16);
    expect(detectRecordingFormat('x', head, 1024)).toBe('c3d');
    expect(detectRecordingFormat('x', head, 100)).not.toBe('c3d');
  });
});
