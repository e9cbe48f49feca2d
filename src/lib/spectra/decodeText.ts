/**
 * Turn the bytes of an uploaded file into text.
 *
 * UTF-8 first (a leading byte-order mark is removed). When the bytes are not
 * valid UTF-8 the file is read as Latin-1; WHATWG's `latin1` label is
 * windows-1252, the superset instrument software on Windows actually writes.
 * A UTF-16 byte-order mark selects UTF-16. Line ends (CRLF, CR) become LF.
 * @param buffer - the file's bytes.
 * @returns the text with LF line ends.
 */
export function decodeText(buffer: Uint8Array): string {
  if (!(buffer instanceof Uint8Array)) {
    throw new RangeError('buffer must be a Uint8Array');
  }
  let text: string;
  if (buffer.length >= 2 && buffer[0] === 0xff && buffer[1] === 0xfe) {
    text = new TextDecoder('utf-16le').decode(buffer);
  } else if (buffer.length >= 2 && buffer[0] === 0xfe && buffer[1] === 0xff) {
    text = new TextDecoder('utf-16be').decode(buffer);
  } else {
    try {
      // fatal: throw on invalid sequences so that we can fall back to Latin-1
      text = new TextDecoder('utf-8', { fatal: true }).decode(buffer);
    } catch {
      text = new TextDecoder('latin1').decode(buffer);
    }
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  return normalizeLineEnds(text);
}

/** CRLF and lone CR become LF. */
export function normalizeLineEnds(text: string): string {
  return text.replace(/\r\n?/g, '\n');
}
