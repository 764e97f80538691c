/**
 * groupedDigits writes whole numbers as Intl's en-GB and en-US number formats do (ECMA-402,
 * the reference here), without loading Intl: every message that names a limit uses it.
 */
import assert from 'node:assert/strict';
import { test } from 'node:test';
import { groupedDigits } from '../../shared/grouped-digits';
import { mulberry32 } from '../bench/make-diary';

test('groups digits in threes exactly as Intl en-GB and en-US do, for every size of safe integer and both signs', () => {
  const edges = [0, -0, 1, -1, 9, 10, 99, 100, 999, 1000, -999, -1000, 9999, 10000, 99999, 100000, 999999, 1000000, 2 ** 31, 2 ** 32, Number.MAX_SAFE_INTEGER, Number.MIN_SAFE_INTEGER];
  const random = mulberry32(11);
  for (let i = 0; i < 2000; i++) edges.push(Math.floor((random() - 0.5) * 10 ** Math.floor(random() * 16)));
  for (const n of edges) {
    assert.equal(groupedDigits(n), n.toLocaleString('en-GB'), `${n}`);
    assert.equal(groupedDigits(n), n.toLocaleString('en-US'), `${n}`);
  }
  assert.equal(groupedDigits(1234567), '1,234,567');
  assert.equal(groupedDigits(-1000), '-1,000');
});

test('leaves what is not a safe integer to Intl (fractions, beyond 2^53 − 1, not finite)', () => {
  for (const n of [0.5, 1234.5678, Number.MAX_SAFE_INTEGER + 2, 1e21, -1e21, Infinity, -Infinity, NaN]) assert.equal(groupedDigits(n), n.toLocaleString('en-GB'), `${n}`);
});
