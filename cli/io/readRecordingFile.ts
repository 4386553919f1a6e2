/**
 * Node side of recording import: reads a file from disk into a Recording. Delimited text is streamed
 * through the incremental reader chunk by chunk, so a file of several hundred MB is never one string;
 * binary formats (C3D, EDF/BDF) are read whole and handed to the pure readers.
 */
import { createReadStream } from 'node:fs';
import { open, readFile, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { ForecatchError } from '../../shared/errors';
import type { Recording } from '../../shared/recording/types';
import { createDelimitedReader } from '../../shared/io/delimited/createDelimitedReader';
import { detectRecordingFormat } from '../../shared/io/detectRecordingFormat';
import { readRecording, type ReadRecordingOptions } from '../../shared/io/readRecording';

/** Options of {@link readRecordingFile}. */
export interface ReadRecordingFileOptions extends ReadRecordingOptions {
  /** Read-stream chunk size in bytes (default 1 MiB). */
  chunkBytes?: number;
}

function ioError(path: string, err: unknown): ForecatchError {
  const e = err as NodeJS.ErrnoException;
  const why = e.code === 'ENOENT' ? 'no such file' : e.code === 'EISDIR' ? 'is a directory' : e.code === 'EACCES' ? 'permission denied' : e.message;
  return new ForecatchError('IO_ERROR', `${path}: cannot read: ${why}`);
}

/**
 * Reads a recording file (C3D, EDF/EDF+, BDF/BDF+, delimited text).
 * @param path - file path
 * @param opts - template and fault policy for delimited text, stream chunk size
 * @returns the recording; its `source` is the file's base name
 * @throws ForecatchError (code `IO_ERROR`) when the file cannot be read; ParseError for bad content
 */
export async function readRecordingFile(path: string, opts: ReadRecordingFileOptions = {}): Promise<Recording> {
  const name = basename(path);
  let size: number;
  let head: Uint8Array;
  try {
    const st = await stat(path);
    if (st.isDirectory()) throw Object.assign(new Error('is a directory'), { code: 'EISDIR' });
    size = st.size;
    const fh = await open(path, 'r');
    try {
      const buf = new Uint8Array(Math.min(4096, size));
      await fh.read(buf, 0, buf.length, 0);
      head = buf;
    } finally {
      await fh.close();
    }
  } catch (err) {
    throw ioError(path, err);
  }
  if (detectRecordingFormat(name, head, size) !== 'delimited') {
    let bytes: Uint8Array;
    try {
      bytes = await readFile(path);
    } catch (err) {
      throw ioError(path, err);
    }
    return readRecording(name, bytes, opts);
  }
  const reader = createDelimitedReader(name, { template: opts.template, onFault: opts.onFault, expectedBytes: size });
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: opts.chunkBytes ?? 1 << 20 });
  try {
    for await (const chunk of stream) reader.push(chunk as string);
  } catch (err) {
    stream.destroy();
    if (err instanceof ForecatchError || err instanceof RangeError) throw err;
    throw ioError(path, err);
  }
  return reader.finish();
}
