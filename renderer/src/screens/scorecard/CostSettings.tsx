/**
 * The diary-wide default costs of a false alarm and of a miss (used by every question without
 * costs of its own), edited here and saved to the diary's settings.
 */
import { useEffect, useState, type FormEvent } from 'react';
import type { Settings } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { RequestError, describeError, fieldReasons } from '../../api/errors';
import { Button } from '../../components/Button';
import { ErrorBanner } from '../../components/ErrorBanner';
import { NumberField } from '../../components/NumberField';
import { useToast } from '../../components/Toast';

function costProblem(text: string): string | undefined {
  const n = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(n)) return 'must be a number';
  if (n <= 0) return 'must be a cost greater than 0';
  return undefined;
}

export function CostSettings({ settings }: { settings: Settings }) {
  const toast = useToast();
  const [falseAlarm, setFalseAlarm] = useState(String(settings.default_false_alarm_cost));
  const [miss, setMiss] = useState(String(settings.default_miss_cost));
  const [errors, setErrors] = useState<{ falseAlarm?: string | undefined; miss?: string | undefined }>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  // Show what the diary holds after any save (here or elsewhere).
  useEffect(() => {
    setFalseAlarm(String(settings.default_false_alarm_cost));
    setMiss(String(settings.default_miss_cost));
  }, [settings.default_false_alarm_cost, settings.default_miss_cost]);

  const changed = Number(falseAlarm) !== settings.default_false_alarm_cost || Number(miss) !== settings.default_miss_cost;

  async function save(event: FormEvent) {
    event.preventDefault();
    const found = { falseAlarm: costProblem(falseAlarm), miss: costProblem(miss) };
    setErrors(found);
    setProblem(null);
    if (found.falseAlarm || found.miss) return;
    setBusy(true);
    try {
      await api.updateSettings({ default_false_alarm_cost: Number(falseAlarm), default_miss_cost: Number(miss) });
      diaryChanged();
      toast.show({ message: 'Saved the default costs. The scorecard now uses them for questions without their own.' });
    } catch (error) {
      if (error instanceof RequestError && error.fields.length > 0) {
        const reasons = fieldReasons(error.fields);
        setErrors({ falseAlarm: reasons.get('default_false_alarm_cost'), miss: reasons.get('default_miss_cost') });
      }
      setProblem(describeError(error));
    } finally {
      setBusy(false);
    }
  }

  return (
    <form className="sc-costs" onSubmit={save} noValidate aria-labelledby="sc-default-costs">
      <h3 id="sc-default-costs" className="sc-subhead">
        Default costs (saved to the diary)
      </h3>
      <p className="muted sc-small">Used for every question that has no costs of its own. Any unit works; only the ratio matters for the threshold.</p>
      {problem ? <ErrorBanner message={problem} /> : null}
      <div className="sc-costs__row">
        <NumberField label="False-alarm cost" value={falseAlarm} onChange={setFalseAlarm} min={0} step="any" error={errors.falseAlarm} />
        <NumberField label="Miss cost" value={miss} onChange={setMiss} min={0} step="any" error={errors.miss} />
        <Button type="submit" busy={busy} disabled={!changed} className="sc-costs__save">
          Save defaults
        </Button>
      </div>
    </form>
  );
}
