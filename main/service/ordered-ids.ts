/**
 * Ids for the rows a question gathers (revisions, reference forecasts): UUID version 7
 * (RFC 9562 §5.7), whose leading 48 bits are the Unix time in milliseconds, made strictly
 * increasing within this process by a counter in the bits after the version (§6.2,
 * method 1: rand_a and the top of rand_b, seeded at random each millisecond).
 *
 * Why not random ids: each id goes into a unique index. Random ids land on a random page of
 * that index, so an import of millions of revisions touches a page per row that has fallen
 * out of SQLite's cache, and every row costs more than the one before. Increasing ids are
 * appended at the index's end, so each row costs the same however large the diary is.
 */
import { randomFillSync } from 'node:crypto';

const COUNTER_BITS = 42;
const COUNTER_LIMIT = 2 ** COUNTER_BITS;
const LOW_30 = 2 ** 30;

const random = new Uint32Array(512);
let next = random.length;

function random32(): number {
  if (next === random.length) {
    randomFillSync(random);
    next = 0;
  }
  return random[next++]!;
}

let lastMs = -1;
let counter = 0;
/** The first groups of an id (time and version), kept for the millisecond they spell. */
let groupsMs = -1;
let groups = '';

const hex = (n: number, width: number) => n.toString(16).padStart(width, '0');

// An import writes an id per revision, millions of them: hex digits by table lookup cost
// a fraction of toString(16) and padStart.
const BYTE_HEX = Array.from({ length: 256 }, (_, b) => hex(b, 2));
const DIGIT_HEX = BYTE_HEX.map((h) => h[1]!);
/** The low 12 bits of n as 3 hex digits. */
const hex3 = (n: number) => DIGIT_HEX[(n >>> 8) & 0xf]! + BYTE_HEX[n & 0xff]!;
/** The low 16 bits of n as 4 hex digits. */
const hex4 = (n: number) => BYTE_HEX[(n >>> 8) & 0xff]! + BYTE_HEX[n & 0xff]!;
/** n (32 bits) as 8 hex digits. */
const hex8 = (n: number) => hex4(n >>> 16) + hex4(n);

/** A new UUIDv7, greater (as text) than every id this function returned before. */
export function orderedId(now = Date.now()): string {
  if (now > lastMs) {
    lastMs = now;
    // Seeded below half the counter's range, so a busy millisecond has room to count up.
    counter = (random32() >>> 21) * LOW_30 + (random32() >>> 2);
  } else if (++counter >= COUNTER_LIMIT) {
    lastMs++;
    counter = 0;
  }
  if (groupsMs !== lastMs) {
    groupsMs = lastMs;
    const time = hex(lastMs, 12);
    groups = `${time.slice(0, 8)}-${time.slice(8)}-7`;
  }
  const randA = Math.floor(counter / LOW_30);
  const randB = counter % LOW_30;
  return `${groups}${hex3(randA)}-${hex4(0x8000 | (randB >>> 16))}-${hex4(randB)}${hex8(random32())}`;
}
