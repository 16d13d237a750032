import "server-only";
/**
 * One gzip body (RFC 1952) around a middle that was deflated once and stored: the small parts before and after
 * it, which change from answer to answer (a run's verification, "stale"), go in as stored (uncompressed)
 * deflate blocks, so an answer costs a few hundred bytes of copying instead of compressing 200 kB again.
 * The middle must be a raw deflate stream ended by a sync flush (byte-aligned, no final block), as
 * db/stored-results.ts makes it; its back-references never reach before its own start, so any bytes may precede it.
 */
import { crc32 } from "node:zlib";

/** ID1 ID2, CM = deflate, no flags, no modification time, no extra flags, OS unknown. */
const GZIP_HEADER = Buffer.from([0x1f, 0x8b, 0x08, 0, 0, 0, 0, 0, 0, 0xff]);
const MAX_STORED_BLOCK = 65_535;

export interface DeflatedMiddle {
  /** Raw deflate, ended by a sync flush. */
  deflate: Buffer;
  /** CRC-32 and byte length of what `deflate` inflates to. */
  crc32: number;
  length: number;
}

/** Stored deflate blocks (RFC 1951 §3.2.4) holding `data`; the last is the stream's final block when `final`. */
function storedBlocks(data: Buffer, final: boolean): Buffer[] {
  const blocks: Buffer[] = [];
  let offset = 0;
  do {
    const n = Math.min(MAX_STORED_BLOCK, data.length - offset);
    const header = Buffer.alloc(5);
    // BFINAL in bit 0, BTYPE 00 (stored); we are byte-aligned, so the header's padding fills the byte.
    header[0] = final && offset + n === data.length ? 1 : 0;
    header.writeUInt16LE(n, 1);
    header.writeUInt16LE(~n & 0xffff, 3);
    blocks.push(header, data.subarray(offset, offset + n));
    offset += n;
  } while (offset < data.length);
  return blocks;
}

/** The chunks of one gzip member inflating to `before` + the middle + `after`. */
export function gzipAround(before: Buffer, middle: DeflatedMiddle, after: Buffer): Buffer[] {
  const crc = crc32(after, crc32Combine(crc32(before), middle.crc32, middle.length));
  const trailer = Buffer.alloc(8);
  trailer.writeUInt32LE(crc >>> 0, 0);
  // ISIZE is the length modulo 2^32.
  trailer.writeUInt32LE((before.length + middle.length + after.length) % 0x1_0000_0000, 4);
  return [GZIP_HEADER, ...storedBlocks(before, false), middle.deflate, ...storedBlocks(after, true), trailer];
}

// CRC-32 of two pieces joined, from the CRCs of each: zlib's crc32_combine (polynomial arithmetic modulo the
// CRC polynomial, reflected), which Node does not expose.
const POLY = 0xedb88320;

/** a × b modulo the CRC polynomial (bit-reflected); `a` is never 0 here. */
function multModP(a: number, b: number): number {
  let m = 0x8000_0000;
  let p = 0;
  for (;;) {
    if (a & m) {
      p ^= b;
      if ((a & (m - 1)) === 0) break;
    }
    m >>>= 1;
    b = b & 1 ? (b >>> 1) ^ POLY : b >>> 1;
  }
  return p >>> 0;
}

/** X2N[k] = x^(2^k) modulo the polynomial. */
const X2N: number[] = [0x4000_0000];
for (let k = 1; k < 32; k++) X2N.push(multModP(X2N[k - 1], X2N[k - 1]));

/** x^(n · 2^k) modulo the polynomial. */
function x2nModP(n: number, k: number): number {
  let p = 0x8000_0000; // x^0
  while (n > 0) {
    if (n % 2 === 1) p = multModP(X2N[k & 31], p);
    n = Math.floor(n / 2);
    k++;
  }
  return p;
}

/** CRC-32 of A + B from crc32(A), crc32(B) and B's length in bytes. */
export function crc32Combine(crcA: number, crcB: number, lengthB: number): number {
  return (multModP(x2nModP(lengthB, 3), crcA >>> 0) ^ crcB) >>> 0;
}
