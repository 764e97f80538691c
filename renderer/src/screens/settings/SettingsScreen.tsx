/**
 * Settings: when nudges come (check-in cadence, closing-soon warning, overdue line, quiet
 * hours), the diary's time zone, the default costs of a false alarm and a miss with the
 * action threshold they imply, where the diary file lives, and the diary's files in and out.
 */
import { useEffect, useId, useMemo, useRef, useState, type FormEvent } from 'react';
import { settingsPatch } from '../../../../shared/contract';
import type { Settings } from '../../../../shared/domain';
import { costLossThreshold } from '../../../../shared/scoring/decisions';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { describeError } from '../../api/errors';
import { useLoad } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { ConfirmDialog } from '../../components/ConfirmDialog';
import { DiscardDialog } from '../../components/DiscardDialog';
import { ErrorBanner } from '../../components/ErrorBanner';
import { Form } from '../../components/Form';
import { NumberField } from '../../components/NumberField';
import { Select } from '../../components/Select';
import { TextField } from '../../components/TextField';
import { formatCount, formatTimeText, plural, timePlaceholder, timeZoneNames, zoneName } from '../../dates';
import { useDiaryInfo } from '../../diaryInfo';
import { replacedValues, useSettingsUndoToast } from '../../forgiving/settingsUndo';
import { useUndoToast } from '../../forgiving/undo';
import { useDocumentTitle } from '../../hooks';
import { useForm } from '../../forms';
import { useLeaveGuard } from '../../leaveGuard';
import { formatPercent } from '../../percent';
import { DataSection } from './DataSection';
import { draftFrom, numberIn, patchFrom, sameDraft, type SettingsDraft } from './draft';
import './settings.css';

export function SettingsScreen() {
  useDocumentTitle('Settings');
  const settings = useLoad(() => api.getSettings({}), []);
  return (
    <div className="screen settings">
      <header className="screen__header">
        <h1>Settings</h1>
      </header>
      {settings.error && !settings.data ? <ErrorBanner message={describeError(settings.error)} onRetry={settings.reload} /> : null}
      {/* Mounted once with the first answer: later reloads must not overwrite what is being typed. */}
      <DiaryFile />
      {settings.data ? <SettingsForm initial={settings.data} /> : null}
      <DataSection />
    </div>
  );
}

function SettingsForm({ initial }: { initial: Settings }) {
  const form = useForm();
  const settingsUndo = useSettingsUndoToast();
  const [saved, setSaved] = useState(() => draftFrom(initial));
  const [draft, setDraft] = useState(saved);
  const dirty = !sameDraft(draft, saved);
  const set = <K extends keyof SettingsDraft>(key: K) => (value: SettingsDraft[K]) => setDraft((d) => ({ ...d, [key]: value }));
  // Leaving with unsaved changes asks first; `leave` is where the user was going.
  const [leave, setLeave] = useState<(() => void) | null>(null);
  useLeaveGuard(dirty, (proceed) => setLeave(() => proceed));

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const built = patchFrom(draft);
    if (!form.check(built.errors, { schema: settingsPatch, request: built.patch, placement: PLACEMENT })) return;
    let answer: Settings | undefined;
    let before: Settings | undefined;
    const ok = await form.submit(async () => {
      // What the diary holds just before the save is what Undo puts back.
      before = await api.getSettings({});
      answer = await api.updateSettings(built.patch);
    }, PLACEMENT);
    if (ok && answer && before) {
      const next = draftFrom(answer);
      setSaved(next);
      setDraft(next);
      settingsUndo('Settings saved. Nudges and the Desk follow them from now on.', replacedValues(before, built.patch), (restored) => {
        const back = draftFrom(restored);
        setSaved(back);
        // What was typed since the save stays in the form.
        setDraft((d) => (sameDraft(d, next) ? back : d));
      });
      diaryChanged();
    }
  }

  return (
    <Form form={form} label="Settings" className="settings__form" onSubmit={onSubmit} dirty={dirty}>
      <NudgeSection draft={draft} set={set} error={form.error} />
      <TimeZoneSection value={draft.timeZone} onChange={set('timeZone')} error={form.error('time_zone')} />
      <CostSection draft={draft} set={set} error={form.error} />
      <div className="settings__actions">
        <p className="settings__status" aria-live="polite">
          {dirty ? 'You have unsaved changes.' : ''}
        </p>
        <Button
          disabled={!dirty || form.busy}
          onClick={() => {
            // The saved values are valid: a message about a discarded value would now sit beside the wrong number.
            setDraft(saved);
            form.clear();
          }}
        >
          Discard changes
        </Button>
        <Button type="submit" variant="primary" busy={form.busy}>
          Save settings
        </Button>
      </div>
      <DiscardDialog
        open={leave !== null}
        what="Settings"
        onKeep={() => setLeave(null)}
        onDiscard={() => {
          const go = leave;
          setLeave(null);
          go?.();
        }}
      />
    </Form>
  );
}

const LABELS = {
  default_checkin_days: 'Check in every',
  closing_soon_hours: 'Closing-soon warning',
  overdue_after_days: 'Overdue after',
  'quiet_hours.start': 'Quiet from',
  'quiet_hours.end': 'Quiet until',
  time_zone: 'Diary time zone',
  default_false_alarm_cost: 'False-alarm cost',
  default_miss_cost: 'Miss cost',
};
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS };

type Setter = <K extends keyof SettingsDraft>(key: K) => (value: SettingsDraft[K]) => void;

interface SectionProps {
  draft: SettingsDraft;
  set: Setter;
  error: (field: string) => string | undefined;
}

function NudgeSection({ draft, set, error }: SectionProps) {
  const quietId = useId();
  return (
    <section className="card settings__section" aria-labelledby="settings-nudges">
      <h2 id="settings-nudges" className="card__title">
        Nudges
      </h2>
      <p className="settings__intro">When Forelog reminds you about a question. Each question can set its own check-in cadence; these are the defaults.</p>
      <div className="form__row">
        <NumberField
          label="Check in every"
          suffix="days"
          min={0}
          step={1}
          value={draft.checkinDays}
          onChange={set('checkinDays')}
          hint="0 means no check-ins."
          error={error('default_checkin_days')}
        />
        <NumberField
          label="Closing-soon warning"
          suffix="hours"
          min={1}
          step={1}
          value={draft.closingSoonHours}
          onChange={set('closingSoonHours')}
          hint="How long before a window closes to warn you."
          error={error('closing_soon_hours')}
        />
        <NumberField
          label="Overdue after"
          suffix="days"
          min={0}
          step={1}
          value={draft.overdueAfterDays}
          onChange={set('overdueAfterDays')}
          hint="Days after the close before an unresolved question is overdue."
          error={error('overdue_after_days')}
        />
      </div>
      <fieldset className="form__group settings__quiet">
        <legend>Quiet hours</legend>
        <label className="settings__check" htmlFor={quietId}>
          <input id={quietId} type="checkbox" checked={draft.quietOn} onChange={(event) => set('quietOn')(event.target.checked)} />
          Hold desktop notifications during quiet hours
        </label>
        <p className="field__hint">Nudges that fall due meanwhile wait and go out when quiet hours end. Times are on the diary’s clock (below).</p>
        {draft.quietOn ? (
          <div className="settings__quiet-times">
            <TimeOfDayField label="Quiet from" value={draft.quietStart} onChange={set('quietStart')} error={error('quiet_hours.start')} />
            <TimeOfDayField label="Quiet until" value={draft.quietEnd} onChange={set('quietEnd')} error={error('quiet_hours.end')} />
          </div>
        ) : null}
      </fieldset>
    </section>
  );
}

/**
 * A time of day, typed and shown as every other time box has it (`parseTimeText`): "22:00",
 * or "10:00 PM" where the locale uses a 12-hour clock, as the Desk and nudges write times.
 * The draft turns it into the diary's 24-hour HH:MM on save (`quietTimeValue`). A text box
 * rather than the browser's time picker, whose clock follows the system, not the page.
 */
function TimeOfDayField({ label, value, onChange, error }: { label: string; value: string; onChange: (value: string) => void; error: string | undefined }) {
  return (
    <TextField
      label={label}
      value={value}
      onChange={onChange}
      error={error}
      hint={`e.g. ${formatTimeText({ hour: 22, minute: 0 })}`}
      autoComplete="off"
      maxLength={20}
      placeholder={timePlaceholder()}
      className="settings__time"
    />
  );
}

function TimeZoneSection({ value, onChange, error }: { value: string; onChange: (zone: string) => void; error: string | undefined }) {
  const listed = typeof Intl.supportedValuesOf === 'function';
  const options = useMemo(() => (listed ? timeZoneNames(value).map((zone) => ({ value: zone, label: zoneName(zone) })) : []), [listed, value]);
  const hint = 'Quiet hours, snooze mornings and overdue days follow this clock; new questions start in it.';
  return (
    <section className="card settings__section" aria-labelledby="settings-zone">
      <h2 id="settings-zone" className="card__title">
        Time zone
      </h2>
      {listed ? (
        <Select label="Diary time zone" value={value} options={options} onChange={onChange} hint={hint} error={error} className="settings__zone" />
      ) : (
        <TextField label="Diary time zone" value={value} onChange={onChange} hint={`An IANA name such as Europe/London. ${hint}`} error={error} className="settings__zone" />
      )}
    </section>
  );
}

function CostSection({ draft, set, error }: SectionProps) {
  const falseAlarmId = useId();
  const missId = useId();
  const falseAlarm = numberIn(draft.falseAlarmCost);
  const miss = numberIn(draft.missCost);
  const usable = falseAlarm !== null && miss !== null && falseAlarm > 0 && miss > 0;
  return (
    <section className="card settings__section" aria-labelledby="settings-costs">
      <h2 id="settings-costs" className="card__title">
        Costs of being wrong
      </h2>
      <p className="settings__intro">
        What a false alarm (acting when it does not happen) and a miss (not acting when it does) cost you, in any unit — only their ratio matters. The Scorecard uses them for questions without their own costs.
      </p>
      <div className="settings__costs">
        <NumberField
          id={falseAlarmId}
          label="False-alarm cost"
          min={0}
          step="any"
          value={draft.falseAlarmCost}
          onChange={set('falseAlarmCost')}
          error={error('default_false_alarm_cost')}
        />
        <NumberField id={missId} label="Miss cost" min={0} step="any" value={draft.missCost} onChange={set('missCost')} error={error('default_miss_cost')} />
      </div>
      <output className="settings__threshold" htmlFor={`${falseAlarmId} ${missId}`} data-testid="action-threshold">
        {usable ? (
          <>
            Act when your probability is above <strong>{formatPercent(costLossThreshold(falseAlarm, miss))}</strong>
            <span className="muted"> — the action threshold α = false-alarm cost ÷ (false-alarm cost + miss cost).</span>
          </>
        ) : (
          'Enter two costs above 0 to see the probability above which acting pays.'
        )}
      </output>
    </section>
  );
}

function DiaryFile() {
  const info = useDiaryInfo();
  const undoToast = useUndoToast();
  const heading = useRef<HTMLHeadingElement>(null);
  const [asking, setAsking] = useState(false);
  const examples = info.data?.example_questions ?? 0;
  // The Remove button goes with the example: once the section shows that, the keyboard moves
  // to the section's heading rather than falling to the page (the dialog hands it back to the button).
  const [removing, setRemoving] = useState(false);
  useEffect(() => {
    if (!removing || examples > 0 || asking) return;
    setRemoving(false);
    heading.current?.focus();
  }, [removing, examples, asking]);

  async function removeExample() {
    const { removed, undo } = await api.removeDemo({});
    setRemoving(true);
    setAsking(false);
    diaryChanged();
    if (removed === 0) return;
    const what = `the example diary’s ${plural(removed, 'question')}`;
    undoToast({
      message: `Removed ${what}; your own questions are as they were.`,
      undo,
      title: 'the example diary',
      undoneMessage: `Undone: ${what} are back.`,
    });
  }

  return (
    <section className="card settings__section" aria-labelledby="settings-diary">
      <h2 id="settings-diary" className="card__title" ref={heading} tabIndex={-1}>
        Diary
      </h2>
      {info.error && !info.data ? <ErrorBanner message={describeError(info.error)} onRetry={info.reload} /> : null}
      {info.data ? (
        <dl className="facts">
          <dt>Diary file</dt>
          <dd data-testid="diary-location">{info.data.location ? <code className="settings__path">{info.data.location}</code> : 'Not kept in a file (a temporary diary).'}</dd>
          <dt>Questions</dt>
          <dd>{formatCount(info.data.question_count)}</dd>
          {examples > 0 ? (
            <>
              <dt>Example diary</dt>
              <dd data-testid="example-diary">
                {plural(examples, 'question')} from the invented example.{' '}
                <Button size="sm" onClick={() => setAsking(true)}>
                  Remove the example diary
                </Button>
              </dd>
            </>
          ) : null}
        </dl>
      ) : null}
      <ConfirmDialog open={asking} title="Remove the example diary?" confirmLabel="Remove the example" onConfirm={removeExample} onClose={() => setAsking(false)}>
        <p>
          Its {plural(examples, 'question')} leave the diary, with their forecasts and resolutions; the questions you wrote yourself
          stay as they are. Undo in the message that follows brings them back.
        </p>
      </ConfirmDialog>
    </section>
  );
}
