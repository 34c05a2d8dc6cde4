/**
 * A text file read a piece at a time, synchronously (the import worker reads inside one
 * database transaction): UTF-8 decoded as a stream, so a character whose bytes straddle two
 * reads comes out whole. Only one piece is held at a time; the file is closed when the reader
 * stops early too.
 */
import { closeSync, openSync, readSync } from 'node:fs'

/**
 * Bytes read at a time: about 200 rows. A piece and the parser's split of it live until its
 * last row is read, so a smaller piece leaves less alive at each young-generation collection
 * (see IMPORT_CHUNK_ROWS); 64 KiB pieces cost no less time.
 */
export const FILE_PIECE_BYTES = 16 * 1024

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

/**
 * Text sent whole (a file sent as JSON) handed on in pieces of about FILE_PIECE_BYTES
 * characters, as a file is read: the parser splits each piece into its rows, and a piece given
 * whole kept every row of the file alive until its last was read: 44 MiB more of the worker's old
 * generation at 100,000 rows.
 */
export function* textPieces(text: string, pieceChars = FILE_PIECE_BYTES): Generator<string> {
  for (let at = 0; at < text.length; at += pieceChars) yield text.slice(at, at + pieceChars)
}
