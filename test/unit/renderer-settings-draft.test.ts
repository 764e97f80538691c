/** The Settings form's own checks: what only the form can know before the diary's rules run. */
import assert from 'node:assert/strict';
import test from 'node:test';
import { defaultSettings } from '../../shared/domain';
import { draftFrom, patchFrom } from '../../renderer/src/screens/settings/draft';

test('quiet hours ticked with the same start and end are refused beside Quiet until, as they would hold nothing', () => {
  const draft = { ...draftFrom(defaultSettings('Europe/London')), quietOn: true, quietStart: '21:00', quietEnd: '21:00' };
  assert.match(patchFrom(draft).errors['quiet_hours.end'] ?? '', /^must differ from Quiet from: the same start and end would hold nothing/);
  assert.equal(patchFrom({ ...draft, quietEnd: '07:30' }).errors['quiet_hours.end'], undefined);
  // Unticked, the times are not used at all.
  assert.equal(patchFrom({ ...draft, quietOn: false }).errors['quiet_hours.end'], undefined);
});
