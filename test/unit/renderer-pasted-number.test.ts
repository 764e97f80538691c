/**
 * Text pasted into a number box (renderer/src/components/pastedNumber.ts): the box's own
 * unit and the spaces around a number come off; what is still not a number is refused, so
 * the box can say so instead of staying silently empty.
 */
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readPastedNumber } from '../../renderer/src/components/pastedNumber';

test('a number pasted with the box’s unit or spaces around it goes in as the number', () => {
  assert.deepEqual(readPastedNumber('2,100 pallets', 'pallets'), { kind: 'cleaned', text: '2,100' });
  assert.deepEqual(readPastedNumber('2,100 Pallets', 'pallets'), { kind: 'cleaned', text: '2,100' });
  assert.deepEqual(readPastedNumber(' 16.5 ', 'weeks'), { kind: 'cleaned', text: '16.5' });
  assert.deepEqual(readPastedNumber('35%', '%'), { kind: 'cleaned', text: '35' });
  assert.deepEqual(readPastedNumber('1800', 'pallets'), { kind: 'as-is' });
  assert.deepEqual(readPastedNumber('-3.5e2'), { kind: 'as-is' });
});

test('text that is not a number, with or without the unit, is refused and named', () => {
  assert.deepEqual(readPastedNumber('about 2100', 'pallets'), { kind: 'refused', text: 'about 2100' });
  assert.deepEqual(readPastedNumber('2100 tonnes', 'pallets'), { kind: 'refused', text: '2100 tonnes' });
  assert.deepEqual(readPastedNumber('pallets', 'pallets'), { kind: 'refused', text: 'pallets' });
  assert.deepEqual(readPastedNumber('  ', 'pallets'), { kind: 'refused', text: '' });
  assert.deepEqual(readPastedNumber('1.2.3'), { kind: 'refused', text: '1.2.3' });
});
