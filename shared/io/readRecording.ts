/**
 * One entry point for every recording file: detects C3D, EDF/EDF+, BDF/BDF+ or delimited text and
 * returns a Recording.
 */
import { ParseError } from '../errors';
import type { Recording } from '../recording/types';
import { c3dToRecording } from './c3d/c3dToRecording';
import { readC3d } from './c3d/readC3d';
import { createDelimitedReader, type DelimitedReaderOptions } from './delimited/createDelimitedReader';
import { detectRecordingFormat } from './detectRecordingFormat';
import { readEdf } from './edf/readEdf';
import type { ImportTemplate } from './importTemplate';
import { createUtf8Decoder } from './textCodec';

/** Options of {@link readRecording}. */
export interface ReadRecordingOptions {
  /** Column mapping for delimited text (ignored for binary formats). */
  template?: ImportTemplate;
  /** Fault policy for delimited text (see DelimitedReaderOptions). */
  onFault?: DelimitedReaderOptions['onFault'];
}

const TEXT_SLICE = 1 << 20;

/**
 * Reads a recording file held in memory.
 * @param fileName - the file name (extension used only when the content is not recognised)
 * @param bytes - the file's bytes
 * @param opts - template and fault policy for delimited text
 * @returns the recording
 * @throws ParseError naming the file and the byte offset or line of the first fault, and what was expected
 */
export function readRecording(fileName: string, bytes: Uint8Array, opts: ReadRecordingOptions = {}): Recording {
  const kind = detectRecordingFormat(fileName, bytes);
  switch (kind) {
    case 'c3d':
      return c3dToRecording(readC3d(bytes, fileName));
    case 'edf':
    case 'bdf':
      return readEdf(bytes, fileName);
    case 'delimited': {
      const reader = createDelimitedReader(fileName, { template: opts.template, onFault: opts.onFault, expectedBytes: bytes.length });
      const decoder = createUtf8Decoder();
      for (let i = 0; i < bytes.length; i += TEXT_SLICE) {
        reader.push(decoder.decode(bytes.subarray(i, Math.min(bytes.length, i + TEXT_SLICE)), { stream: true }));
      }
      reader.push(decoder.decode(new Uint8Array(0)));
      return reader.finish();
    }
    default:
      throw new ParseError({ file: fileName, byteOffset: 0 }, 'a C3D, EDF/EDF+, BDF/BDF+ or delimited text file', bytes.length === 0 ? 'an empty file' : 'unrecognised binary content');
  }
}
