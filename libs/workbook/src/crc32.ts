/**
 * CRC-32 as zip archives use it (ISO-HDLC: reflected polynomial 0xEDB88320, initial and final
 * XOR 0xFFFFFFFF; PKWARE APPNOTE 6.3.10, 4.4.7), computed incrementally over inflated chunks so
 * a damaged entry is caught even when it still inflates to its declared size. Table-driven,
 * one table lookup per byte.
 */

const TABLE = (() => {
  const table = new Uint32Array(256);
  for (let byte = 0; byte < 256; byte += 1) {
    let value = byte;
    for (let bit = 0; bit < 8; bit += 1) {
      value = value & 1 ? 0xedb88320 ^ (value >>> 1) : value >>> 1;
    }
    table[byte] = value >>> 0;
  }
  return table;
})();

/** A running CRC-32. */
export class Crc32 {
  private state = 0xffffffff;

  /** Adds bytes to the checksum. */
  update(bytes: Uint8Array): void {
    let state = this.state;
    for (let index = 0; index < bytes.length; index += 1) {
      state = (TABLE[(state ^ (bytes[index] as number)) & 0xff] as number) ^ (state >>> 8);
    }
    this.state = state;
  }

  /** The checksum of all bytes added so far, as an unsigned 32-bit number. */
  digest(): number {
    return (this.state ^ 0xffffffff) >>> 0;
  }
}
