/**
 * A tiny PNG encoder for palette images (colour type 3, 8 bits per pixel),
 * written to the PNG specification (W3C / ISO 15948): signature, IHDR, PLTE,
 * IDAT holding a zlib stream (RFC 1950) of uncompressed "stored" deflate
 * blocks (RFC 1951 §3.2.4), IEND; chunk CRC-32 and zlib Adler-32 computed
 * here. No compression, so no node: imports — it runs in a browser too.
 * A 400×400 image is about 160 kB, fine for an inline data URL.
 */

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 (polynomial 0xEDB88320) of bytes[from, to). */
export function crc32(bytes: Uint8Array, from = 0, to = bytes.length): number {
  let c = 0xffffffff;
  for (let i = from; i < to; i++) c = CRC_TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** Adler-32 of the bytes. */
export function adler32(bytes: Uint8Array): number {
  let a = 1, b = 0;
  for (let i = 0; i < bytes.length; i++) {
    a = (a + bytes[i]) % 65521;
    b = (b + a) % 65521;
  }
  return ((b << 16) | a) >>> 0;
}

/** zlib stream of stored deflate blocks (at most 65535 bytes each). */
export function zlibStored(data: Uint8Array): Uint8Array {
  const blocks = Math.max(1, Math.ceil(data.length / 65535));
  const out = new Uint8Array(2 + blocks * 5 + data.length + 4);
  out[0] = 0x78; out[1] = 0x01; // deflate, 32 K window, no dictionary, fastest; (0x7801 % 31 == 0)
  let o = 2;
  for (let b = 0; b < blocks; b++) {
    const from = b * 65535, len = Math.min(65535, data.length - from);
    out[o++] = b === blocks - 1 ? 1 : 0; // BFINAL, BTYPE = 00
    out[o++] = len & 0xff; out[o++] = len >>> 8;
    out[o++] = ~len & 0xff; out[o++] = (~len >>> 8) & 0xff;
    out.set(data.subarray(from, from + len), o);
    o += len;
  }
  const ad = adler32(data);
  out[o++] = ad >>> 24; out[o++] = (ad >>> 16) & 0xff; out[o++] = (ad >>> 8) & 0xff; out[o++] = ad & 0xff;
  return out;
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out, 4, 8 + data.length));
  return out;
}

/**
 * Encode a width×height image of palette indices (row-major, top row first)
 * with a palette of up to 256 RGB colours (3 bytes each) and optional
 * per-entry alpha (a tRNS chunk; 0 = fully transparent).
 */
export function encodePalettePng(width: number, height: number, pixels: Uint8Array, palette: Uint8Array, alpha?: Uint8Array): Uint8Array {
  const raw = new Uint8Array(height * (width + 1));
  for (let y = 0; y < height; y++) {
    raw[y * (width + 1)] = 0; // filter: none
    raw.set(pixels.subarray(y * width, (y + 1) * width), y * (width + 1) + 1);
  }
  const ihdr = new Uint8Array(13);
  const v = new DataView(ihdr.buffer);
  v.setUint32(0, width); v.setUint32(4, height);
  ihdr[8] = 8; ihdr[9] = 3; ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0;
  const parts = [
    Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr), chunk("PLTE", palette),
    ...(alpha ? [chunk("tRNS", alpha)] : []),
    chunk("IDAT", zlibStored(raw)), chunk("IEND", new Uint8Array(0)),
  ];
  const out = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
  let o = 0;
  for (const p of parts) { out.set(p, o); o += p.length; }
  return out;
}

const B64 = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

/** Standard base64 (RFC 4648) without line breaks. */
export function base64(bytes: Uint8Array): string {
  const parts: string[] = [];
  let chunkStr = "";
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i], b = i + 1 < bytes.length ? bytes[i + 1] : 0, c = i + 2 < bytes.length ? bytes[i + 2] : 0;
    const n = (a << 16) | (b << 8) | c;
    chunkStr += B64[n >>> 18] + B64[(n >>> 12) & 63] + (i + 1 < bytes.length ? B64[(n >>> 6) & 63] : "=") + (i + 2 < bytes.length ? B64[n & 63] : "=");
    if (chunkStr.length > 8192) { parts.push(chunkStr); chunkStr = ""; }
  }
  parts.push(chunkStr);
  return parts.join("");
}

/** A data: URL for a palette PNG. */
export function pngDataUrl(width: number, height: number, pixels: Uint8Array, palette: Uint8Array, alpha?: Uint8Array): string {
  return `data:image/png;base64,${base64(encodePalettePng(width, height, pixels, palette, alpha))}`;
}
