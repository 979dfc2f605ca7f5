/**
 * Counts `<row` elements in a worksheet's XML as it is inflated, so an xlsx with too many rows
 * is refused before the spreadsheet parser builds them in memory. Chunks may split a tag; the
 * last bytes of each chunk are carried over to the next.
 */

const OPEN = 0x3c; // "<"
const TAG = [0x72, 0x6f, 0x77]; // "row"
const TAG_END = new Set([0x20, 0x09, 0x0a, 0x0d, 0x3e, 0x2f]); // space, tab, LF, CR, ">", "/"

/** A running count of `<row` elements over the chunks of one or more XML streams. */
export class RowTagCounter {
  /** Rows seen so far. */
  count = 0;
  private carry = new Uint8Array(0);

  /** Counts the rows that end in `chunk`, including one split across the previous chunk. */
  push(chunk: Uint8Array): void {
    // A tag split over the boundary: scan the carried tail joined with the chunk's head.
    if (this.carry.length > 0) {
      const seam = new Uint8Array(this.carry.length + Math.min(chunk.length, 4));
      seam.set(this.carry);
      seam.set(chunk.subarray(0, seam.length - this.carry.length), this.carry.length);
      for (let at = 0; at < this.carry.length; at += 1) {
        if (isRowTag(seam, at)) {
          this.count += 1;
        }
      }
    }
    let at = chunk.indexOf(OPEN);
    while (at >= 0 && at + 4 < chunk.length) {
      if (isRowTag(chunk, at)) {
        this.count += 1;
      }
      at = chunk.indexOf(OPEN, at + 1);
    }
    this.carry = chunk.slice(Math.max(0, chunk.length - 4));
  }

  /** Ends one XML stream (the carried tail belongs to no later chunk). */
  finish(): void {
    this.carry = new Uint8Array(0);
  }
}

function isRowTag(bytes: Uint8Array, at: number): boolean {
  return (
    at + 4 < bytes.length &&
    bytes[at] === OPEN &&
    bytes[at + 1] === TAG[0] &&
    bytes[at + 2] === TAG[1] &&
    bytes[at + 3] === TAG[2] &&
    TAG_END.has(bytes[at + 4] as number)
  );
}
