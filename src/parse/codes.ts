// Identifier code → signal index, looked up straight from the bytes of a value change.
// Codes are 1+ printable ASCII characters 33..126 (IEEE 1364-2005 §18.2.1). Short codes
// (the common case) are turned into a number without making a string: one- and two-character
// codes index flat tables by their raw bytes (256 and 65,536 entries, so the parser's hot loop
// can index them with any byte and no range check; bytes outside 33..126 hold -1), three to
// seven characters a Map keyed by a base-95 number whose digits are 1..94 (so lengths never
// collide), longer ones a Map keyed by the text. Maps, not objects, so codes like `__proto__`
// are ordinary keys.

const SPAN = 94;
const MAX_NUMERIC_LENGTH = 7;

export class CodeTable {
  /** One-character codes by byte. */
  readonly one = new Int32Array(256).fill(-1);
  /** Two-character codes by `first << 8 | second`. */
  readonly two = new Int32Array(65536).fill(-1);
  private numeric = new Map<number, number>();
  private text = new Map<string, number>();

  /** Signal index for code bytes [s, e), or -1 when unknown or not printable ASCII. */
  lookup(buf: Uint8Array, s: number, e: number): number {
    const n = e - s;
    if (n === 1) return this.one[buf[s]];
    if (n === 2) return this.two[(buf[s] << 8) | buf[s + 1]];
    if (n <= MAX_NUMERIC_LENGTH && n > 0) {
      let key = 0;
      for (let i = s; i < e; i++) {
        const c = buf[i] - 32;
        if (c < 1 || c > SPAN) return -1;
        key = key * 95 + c;
      }
      return this.numeric.get(key) ?? -1;
    }
    let str = '';
    for (let i = s; i < e; i++) {
      const c = buf[i];
      if (c < 33 || c > 126) return -1;
      str += String.fromCharCode(c);
    }
    return this.text.get(str) ?? -1;
  }

  /** Index for a code string (from a $var line), or -1. */
  get(code: string): number {
    const n = code.length;
    if (!printable(code)) return -1;
    if (n === 1) return this.one[code.charCodeAt(0)];
    if (n === 2) return this.two[(code.charCodeAt(0) << 8) | code.charCodeAt(1)];
    if (n <= MAX_NUMERIC_LENGTH) return this.numeric.get(numericKey(code)) ?? -1;
    return this.text.get(code) ?? -1;
  }

  /** Returns false when the code is empty or has characters outside 33..126. */
  set(code: string, index: number): boolean {
    const n = code.length;
    if (n === 0 || !printable(code)) return false;
    if (n === 1) this.one[code.charCodeAt(0)] = index;
    else if (n === 2) this.two[(code.charCodeAt(0) << 8) | code.charCodeAt(1)] = index;
    else if (n <= MAX_NUMERIC_LENGTH) this.numeric.set(numericKey(code), index);
    else this.text.set(code, index);
    return true;
  }
}

/** Every character in 33..126 (§18.2.1). */
function printable(code: string): boolean {
  for (let i = 0; i < code.length; i++) {
    const c = code.charCodeAt(i);
    if (c < 33 || c > 126) return false;
  }
  return true;
}

/** The base-95 key lookup() computes from bytes, for a code of 3 to 7 printable characters. */
function numericKey(code: string): number {
  let key = 0;
  for (let i = 0; i < code.length; i++) key = key * 95 + (code.charCodeAt(i) - 32);
  return key;
}
