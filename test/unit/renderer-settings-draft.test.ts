/** The Settings form's own checks: what only the form can know before the diary's rules run. */
import assert from 'node:assert/strict';
import test from 'node:test';
import { defaultSettings } from '../../shared/domain';
import { draftFrom, patchFrom, quietTimeText, quietTimeValue } from '../../renderer/src/screens/settings/draft';

test('quiet hours ticked with the same start and end are refused beside Quiet until, as they would hold nothing', () => {
  const draft = { ...draftFrom(defaultSettings('Europe/London')), quietOn: true, quietStart: '21:00', quietEnd: '21:00' };
  assert.match(patchFrom(draft).errors['quiet_hours.end'] ?? '', /^must differ from Quiet from: the same start and end would hold nothing/);
  assert.equal(patchFrom({ ...draft, quietEnd: '07:30' }).errors['quiet_hours.end'], undefined);
  // Unticked, the times are not used at all.
  assert.equal(patchFrom({ ...draft, quietOn: false }).errors['quiet_hours.end'], undefined);
});

test('quiet hours are read as every time box reads a time, in the user’s clock, and sent as the diary’s HH:MM', () => {
  const draft = { ...draftFrom(defaultSettings('Europe/London'), 'en-US'), quietOn: true };
  // Offered and shown on the locale's clock.
  assert.equal(draft.quietStart, '10:00 PM');
  assert.equal(draftFrom(defaultSettings('Europe/London'), 'en-GB').quietStart, '22:00');
  assert.equal(quietTimeText('06:45', 'en-US'), '6:45 AM');
  for (const [typed, stored] of [['10:00 PM', '22:00'], [' 10pm ', '22:00'], ['22:00', '22:00'], ['22.30', '22:30'], ['2230', '22:30'], ['7', '07:00'], ['12:15 am', '00:15']] as const) {
    assert.deepEqual(quietTimeValue(typed, 'en-US'), { ok: true, value: stored }, typed);
  }
  const { patch, errors } = patchFrom({ ...draft, quietStart: ' 10:30 pm', quietEnd: '6:45 AM ' }, 'en-US');
  assert.deepEqual(errors, {});
  assert.deepEqual(patch.quiet_hours, { start: '22:30', end: '06:45' });
  // Not a time: said beside the box, and nothing half-read is sent.
  const bad = patchFrom({ ...draft, quietStart: '25:00', quietEnd: '' }, 'en-GB');
  assert.match(bad.errors['quiet_hours.start'] ?? '', /^25 is not an hour/);
  assert.equal(bad.errors['quiet_hours.end'], 'enter when quiet hours end');
  assert.equal(bad.patch.quiet_hours, undefined);
  // The same time written two ways is still the same time.
  assert.match(patchFrom({ ...draft, quietStart: '10 pm', quietEnd: '22:00' }, 'en-US').errors['quiet_hours.end'] ?? '', /^must differ from Quiet from/);
});
