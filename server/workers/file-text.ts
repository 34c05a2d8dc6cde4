/**
 * A text file read a piece at a time, synchronously (the import worker reads inside one
 * database transaction): UTF-8 decoded as a stream, so a character whose bytes straddle two
 * reads comes out whole. Only one piece is held at a time; the file is closed when the reader
 * stops early too.
 */
import { closeSync, openSync, readSync } from 'node:fs'

/** Bytes read at a time: a few hundred rows. */
export const FILE_PIECE_BYTES = 64 * 1024

/** The text of the file at `path`, in pieces; a byte-order mark is dropped, bytes that are not UTF-8 read as U+FFFD. */
export function* fileText(path: string, pieceBytes = FILE_PIECE_BYTES): Generator<string> {
  const fd = openSync(path, 'r')
  try {
    const buffer = Buffer.allocUnsafe(pieceBytes)
    const decoder = new TextDecoder('utf-8')
    for (let read = readSync(fd, buffer); read > 0; read = readSync(fd, buffer)) {
      yield decoder.decode(buffer.subarray(0, read), { stream: true })
    }
    const rest = decoder.decode()
    if (rest) yield rest
  }
  finally {
    closeSync(fd)
  }
}
