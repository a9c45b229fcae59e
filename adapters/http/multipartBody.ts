import { randomBytes } from 'node:crypto';
import { bufferView } from './bufferView.ts';

/** Field names and file names in a multipart header, escaped as the HTML standard's form encoding does. */
function quoted(text: string): string {
  return `"${text.replace(/"/g, '%22').replace(/\r/g, '%0D').replace(/\n/g, '%0A')}"`;
}

/** One field of a multipart form: text, or a file's bytes with its name and type. */
export type MultipartField = { name: string; text: string } | { name: string; fileName: string; contentType: string; bytes: Uint8Array };

/** A multipart/form-data body (RFC 7578) in pieces; the bytes of a file are not copied. */
export function multipartBody(fields: readonly MultipartField[]): { pieces: Buffer[]; contentType: string } {
  const boundary = `lapsewatch-${randomBytes(12).toString('hex')}`;
  const pieces: Buffer[] = [];
  for (const field of fields) {
    if ('bytes' in field) {
      pieces.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name=${quoted(field.name)}; filename=${quoted(field.fileName)}\r\nContent-Type: ${field.contentType}\r\n\r\n`, 'utf8'));
      pieces.push(bufferView(field.bytes), Buffer.from('\r\n'));
    } else {
      pieces.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name=${quoted(field.name)}\r\n\r\n${field.text}\r\n`, 'utf8'));
    }
  }
  pieces.push(Buffer.from(`--${boundary}--\r\n`));
  return { pieces, contentType: `multipart/form-data; boundary=${boundary}` };
}
