/**
 * Byte scanner for the Matrix Market exchange format (Boisvert, Pozo &
 * Remington 1996, "The Matrix Market Exchange Formats: Initial Design", NIST).
 *
 * Reads decimal integers and reals straight from UTF-8 bytes without building
 * a string per line. Reals take the exact fast path of Clinger (1990, "How to
 * read floating point numbers accurately", PLDI): a mantissa of at most 15
 * significant digits times a power of ten in 10^-22..10^22 is one correctly
 * rounded IEEE operation. Every other spelling that fits the decimal grammar
 * falls back to `Number()` on the token, which is also correctly rounded.
 */

import { MatrixMarketError } from "../errors.js";

const NL = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;
const PERCENT = 37;
const PLUS = 43;
const MINUS = 45;
const DOT = 46;
const ZERO = 48;
const NINE = 57;
const LOWER_E = 101;
const UPPER_E = 69;

/** Exact powers of ten 10^0..10^22 (all representable as doubles). */
const POW10 = new Float64Array(23);
for (let k = 0, p = 1; k < 23; k++, p *= 10) POW10[k] = p;

/** Largest count of significant digits whose integer value is exact in a double. */
const EXACT_DIGITS = 15;

/** True for the bytes that separate fields: space, tab, carriage return. */
function isBlank(ch: number): boolean {
  return ch === SPACE || ch === TAB || ch === CR;
}

/** A read position in the bytes, with the 1-based number of its line. */
export class Cursor {
  pos = 0;
  line = 1;
  /**
   * @param bytes the UTF-8 text
   * @param ascii the same text as a string when every character is ASCII
   *   (byte offsets are then string offsets), else null
   */
  constructor(
    readonly bytes: Uint8Array,
    private readonly ascii: string | null = null,
  ) {}

  /** Bytes start..end (an ASCII number token) as a string. */
  slice(start: number, end: number): string {
    if (this.ascii !== null) return this.ascii.slice(start, end);
    let s = "";
    for (let p = start; p < end; p++) s += String.fromCharCode(this.bytes[p]!);
    return s;
  }

  /** Skip spaces, tabs and carriage returns. */
  skipBlanks(): void {
    const b = this.bytes;
    let p = this.pos;
    while (p < b.length && isBlank(b[p]!)) p++;
    this.pos = p;
  }

  /** After skipping blanks: is the cursor at the end of a line or of the text? */
  atLineEnd(): boolean {
    this.skipBlanks();
    return this.pos >= this.bytes.length || this.bytes[this.pos] === NL;
  }

  /** Move past the rest of the current line (including its newline). */
  nextLine(): void {
    const b = this.bytes;
    let p = lineEnd(b, this.pos);
    if (p < b.length) {
      p++;
      this.line++;
    }
    this.pos = p;
  }

  /**
   * Move to the first field of the next line that holds data, skipping blank
   * lines and comment lines (their text, after '%', goes into `comments`).
   * Returns false at the end of the text.
   */
  toContent(comments: string[]): boolean {
    const b = this.bytes;
    for (;;) {
      this.skipBlanks();
      if (this.pos >= b.length) return false;
      const ch = b[this.pos];
      if (ch === PERCENT) comments.push(commentText(b, this.pos + 1, lineEnd(b, this.pos)));
      else if (ch !== NL) return true;
      this.nextLine();
    }
  }

  /** Move past the token at the cursor (up to the next blank, newline or end of text). */
  skipToken(): void {
    while (!endsToken(this.bytes, this.pos)) this.pos++;
  }

  /** The token starting at the cursor (up to the next blank), for messages. */
  token(): string {
    return tokenAt(this.bytes, this.pos);
  }

  /** Number of the last line that exists (for errors at the end of the text). */
  lastLine(): number {
    const b = this.bytes;
    return b.length > 0 && b[b.length - 1] === NL ? this.line - 1 : this.line;
  }

  /** Raise a MatrixMarketError on the current line. */
  fail(message: string): never {
    throw new MatrixMarketError(this.line, message);
  }
}

/** Index of the newline ending the line that holds `p` (or the text length). */
export function lineEnd(b: Uint8Array, p: number): number {
  while (p < b.length && b[p] !== NL) p++;
  return p;
}

/** Text of a comment line after its '%': one leading space and the trailing CR dropped. */
function commentText(b: Uint8Array, start: number, end: number): string {
  if (start < end && b[start] === SPACE) start++;
  if (end > start && b[end - 1] === CR) end--;
  return decodeText(b.subarray(start, end));
}

const decoder = new TextDecoder("utf-8");

/** Decode a short slice of bytes as UTF-8 text. */
export function decodeText(b: Uint8Array): string {
  return decoder.decode(b);
}

/** The token starting at `p`: bytes up to the next blank or newline, at most 40 shown. */
function tokenAt(b: Uint8Array, p: number): string {
  let e = p;
  while (e < b.length && !isBlank(b[e]!) && b[e] !== NL) e++;
  const text = decodeText(b.subarray(p, Math.min(e, p + 40)));
  return e - p > 40 ? `${text}...` : text;
}

/** True when the byte at `p` ends a token (blank, newline or end of text). */
function endsToken(b: Uint8Array, p: number): boolean {
  return p >= b.length || isBlank(b[p]!) || b[p] === NL;
}

/**
 * Read a decimal integer (optional sign, digits) at the cursor. Returns NaN,
 * leaving the cursor in place, when the token is not such an integer.
 * Integers past 15 digits are converted by `Number()` on the token.
 */
export function scanInteger(c: Cursor): number {
  const b = c.bytes;
  let p = c.pos;
  let neg = false;
  let ch = b[p];
  if (ch === MINUS || ch === PLUS) {
    neg = ch === MINUS;
    ch = b[++p];
  }
  const digitsStart = p;
  let v = 0;
  while (ch !== undefined && ch >= ZERO && ch <= NINE) {
    v = v * 10 + (ch - ZERO);
    ch = b[++p];
  }
  if (p === digitsStart || !endsToken(b, p)) return NaN;
  if (p - digitsStart > EXACT_DIGITS) v = Math.abs(Number(c.slice(digitsStart, p)));
  c.pos = p;
  return neg ? -v : v;
}

/**
 * Read a decimal real at the cursor: [sign] digits [. digits] [(e|E) [sign] digits],
 * with at least one mantissa digit. Returns NaN, leaving the cursor in place,
 * when the token does not fit this grammar. The result may be ±Infinity when
 * the exponent overflows; the caller decides what that means.
 */
export function scanReal(c: Cursor): number {
  const b = c.bytes;
  const start = c.pos;
  let p = start;
  let ch = b[p];
  const neg = ch === MINUS;
  if (neg || ch === PLUS) ch = b[++p];
  // Significand = head·10^tailDigits + tail: the first 15 significant digits
  // in head, the next 4 in tail; sig counts them all. Zeros wait in
  // pendingZeros until a non-zero digit follows, so trailing zeros (as in
  // 1.0000000000000000e+00) cost nothing. value = significand·10^(exp10 + pendingZeros).
  let head = 0;
  let tail = 0;
  let tailDigits = 0;
  let sig = 0;
  let pendingZeros = 0;
  let exp10 = 0;
  let digits = 0;
  let seenDot = false;
  for (; ch !== undefined; ch = b[++p]) {
    if (ch >= ZERO && ch <= NINE) {
      digits++;
      if (seenDot) exp10--;
      if (ch === ZERO) {
        if (sig !== 0) pendingZeros++;
        continue;
      }
      if (pendingZeros > 0 && sig + pendingZeros > MAX_DIGITS) {
        sig += pendingZeros; // too long for the fast paths anyway
      } else {
        for (; pendingZeros > 0; pendingZeros--, sig++) {
          if (sig < EXACT_DIGITS) head *= 10;
          else { tail *= 10; tailDigits++; }
        }
      }
      pendingZeros = 0;
      if (sig < EXACT_DIGITS) head = head * 10 + (ch - ZERO);
      else if (sig < MAX_DIGITS) { tail = tail * 10 + (ch - ZERO); tailDigits++; }
      sig++;
    } else if (ch === DOT && !seenDot) {
      seenDot = true;
    } else break;
  }
  if (digits === 0) return NaN;
  if (ch === LOWER_E || ch === UPPER_E) {
    const e = scanExponent(b, p + 1);
    if (e.end < 0) return NaN;
    exp10 += e.value;
    p = e.end;
  }
  if (!endsToken(b, p)) return NaN;
  c.pos = p;
  if (sig === 0) return neg ? -0 : 0;
  let v = decimalToDouble(head, tail, tailDigits, sig, exp10 + pendingZeros);
  if (Number.isNaN(v)) v = Math.abs(Number(c.slice(start, p)));
  return neg ? -v : v;
}

/** Most significant digits handled without Number(): 15 in head plus 4 in tail. */
const MAX_DIGITS = 19;

/**
 * (head·10^tailDigits + tail)·10^e correctly rounded, or NaN when neither
 * fast path applies. Up to 15 digits with |e| ≤ 22: Clinger's exact path.
 * 16..19 digits with -22 ≤ e < 0: the significand held exactly as a sum of two
 * doubles, divided by 10^-e in double-double arithmetic (Dekker 1971, "A
 * floating-point technique for extending the available precision"), with
 * an error far below 2^-80 relative; the result is accepted only when every
 * value within 2^-80 of it rounds to the same double, which makes it correctly rounded.
 */
function decimalToDouble(head: number, tail: number, tailDigits: number, sig: number, e: number): number {
  if (sig <= EXACT_DIGITS) {
    if (e >= 0 && e <= 22) return head * POW10[e]!;
    if (e < 0 && e >= -22) return head / POW10[-e]!;
    return NaN;
  }
  if (sig > MAX_DIGITS || e >= 0 || e < -22) return NaN;
  // Significand exactly as hi + lo.
  const p = head * POW10[tailDigits]!;
  const pErr = productError(head, POW10[tailDigits]!, p);
  const hi = p + tail;
  const t = hi - p;
  const lo = (p - (hi - t)) + (tail - t) + pErr;
  // (hi + lo) / d in double-double: q1 + q2.
  const d = POW10[-e]!;
  const q1 = hi / d;
  const qd = q1 * d;
  const r = ((hi - qd) - productError(q1, d, qd)) + lo;
  const q2 = r / d;
  const eta = Math.abs(q1) * 8.271806125530277e-25; // 2^-80
  const below = q1 + (q2 - eta);
  return below === q1 + (q2 + eta) ? below : NaN;
}

/** Exact a·b − p for p = fl(a·b), by Dekker's splitting (no fused multiply-add in JS). */
function productError(a: number, b: number, p: number): number {
  const ca = 134217729 * a; // 2^27 + 1
  const ah = ca - (ca - a);
  const al = a - ah;
  const cb = 134217729 * b;
  const bh = cb - (cb - b);
  const bl = b - bh;
  return ((ah * bh - p) + ah * bl + al * bh) + al * bl;
}

/** Exponent digits after 'e'/'E' starting at `p`; `end` is -1 when malformed. */
const exponentResult = { value: 0, end: 0 };
function scanExponent(b: Uint8Array, p: number): { value: number; end: number } {
  let ch = b[p];
  const neg = ch === MINUS;
  if (neg || ch === PLUS) ch = b[++p];
  const first = p;
  let v = 0;
  while (ch !== undefined && ch >= ZERO && ch <= NINE) {
    if (v < 1e6) v = v * 10 + (ch - ZERO);
    ch = b[++p];
  }
  exponentResult.value = neg ? -v : v;
  exponentResult.end = p === first ? -1 : p;
  return exponentResult;
}
