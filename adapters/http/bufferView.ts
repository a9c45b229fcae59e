/** A Buffer over the same bytes, not a copy: pictures go to the socket as they are (each copy of a 50-200 kB PNG per answer was garbage to collect). */
export function bufferView(bytes: ArrayBufferView): Buffer {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}
