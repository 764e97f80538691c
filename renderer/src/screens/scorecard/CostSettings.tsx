/**
 * The diary-wide default costs of a false alarm and of a miss (used by every question without
 * costs of its own), edited here and saved to the diary's settings.
 */
import { useEffect, useState, type FormEvent } from 'react';
import { settingsPatch } from '../../../../shared/contract';
import type { Settings } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { Button } from '../../components/Button';
import { Form } from '../../components/Form';
import { NumberField } from '../../components/NumberField';
import { replacedValues, useSettingsUndoToast } from '../../forgiving/settingsUndo';
import { useForm } from '../../forms';
import { readDecimal } from '../../../../shared/numeric-value';

const LABELS = { default_false_alarm_cost: 'False-alarm cost', default_miss_cost: 'Miss cost' };
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS };

function costProblem(text: string): string | undefined {
  if (readDecimal(text) === null) return 'must be a number';
  return undefined;
}

export function CostSettings({ settings }: { settings: Settings }) {
  const settingsUndo = useSettingsUndoToast();
  const form = useForm();
  const [falseAlarm, setFalseAlarm] = useState(String(settings.default_false_alarm_cost));
  const [miss, setMiss] = useState(String(settings.default_miss_cost));

  // Show what the diary holds after any save (here or elsewhere).
  useEffect(() => {
    setFalseAlarm(String(settings.default_false_alarm_cost));
    setMiss(String(settings.default_miss_cost));
  }, [settings.default_false_alarm_cost, settings.default_miss_cost]);

  const changed = Number(falseAlarm) !== settings.default_false_alarm_cost || Number(miss) !== settings.default_miss_cost;

  async function save(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const fa = costProblem(falseAlarm);
    const mi = costProblem(miss);
    if (fa) found.default_false_alarm_cost = fa;
    if (mi) found.default_miss_cost = mi;
    const request = { default_false_alarm_cost: Number(falseAlarm), default_miss_cost: Number(miss) };
    if (!form.check(found, { schema: settingsPatch, request, placement: PLACEMENT })) return;
    let before: Settings | undefined;
    const ok = await form.submit(async () => {
      // What the diary holds just before the save is what Undo puts back.
      before = await api.getSettings({});
      await api.updateSettings(request);
    }, PLACEMENT);
    if (ok && before) {
      diaryChanged();
      settingsUndo('Saved the default costs. The scorecard now uses them for questions without their own.', replacedValues(before, request));
    }
  }

  return (
    <Form form={form} label="Default costs" className="sc-costs" onSubmit={save} dirty={false}>
      <h3 id="sc-default-costs" className="sc-subhead">
        Default costs (saved to the diary)
      </h3>
      <p className="muted sc-small">Used for every question that has no costs of its own. Any unit works; only the ratio matters for the threshold.</p>
      <div className="sc-costs__row">
        <NumberField label="False-alarm cost" value={falseAlarm} onChange={setFalseAlarm} min={0} step="any" error={form.error('default_false_alarm_cost')} />
        <NumberField label="Miss cost" value={miss} onChange={setMiss} min={0} step="any" error={form.error('default_miss_cost')} />
        <Button type="submit" busy={form.busy} disabled={!changed} className="sc-costs__save">
          Save defaults
        </Button>
      </div>
    </Form>
  );
}
