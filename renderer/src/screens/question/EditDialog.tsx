/**
 * Every field of a question. Only fields the user actually changed are sent, so an edit to
 * the title cannot shift a stored time by rounding it to the minute.
 */
import { useMemo, useState, type FormEvent } from 'react';
import type { Costs, BinaryQuestion, QuestionKind } from '../../../../shared/domain';
import { DateTimeField } from '../../components/DateTimeField';
import { useCloseRequest } from '../../components/Dialog';
import { Form, FormActions } from '../../components/Form';
import { NumberField } from '../../components/NumberField';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { Select } from '../../components/Select';
import { TagInput } from '../../components/TagInput';
import { TextArea } from '../../components/TextArea';
import { TextField } from '../../components/TextField';
import { isoToLocal, localToIso, timeZoneNames, zoneName } from '../../dates';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import { useForm } from '../../forms';
import { type QuestionChanges, questionDialog, type QuestionFormProps, saveQuestionChanges, useCommonEdits } from './questionForms';
import { percentText, percentToProbability } from '../../percent';
import { BaseRateHelper } from '../../tools/BaseRateHelper';
import { KIND_OPTIONS, kindHint } from './labels';
import { readDecimal } from '../../../../shared/numeric-value';

const LABELS = {
  title: 'Question',
  rule: 'Resolution rule',
  kind: 'Kind',
  tags: 'Tags',
  opened_at: 'Opened',
  closes_at: 'Closes',
  time_zone: 'Time zone',
  base_rate: 'Base rate',
  base_rate_note: 'Reference class',
  'costs.false_alarm': 'False-alarm cost',
  'costs.miss': 'Miss cost',
  checkin_days: 'Check in every',
};
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS, prefix: 'changes', aliases: { costs: 'costs.false_alarm' } };

export const EditDialog = questionDialog(EditForm, () => ({ title: 'Edit question', size: 'lg' }));

function numberOrBlank(text: string): number | null | 'invalid' {
  if (text.trim() === '') return null;
  return readDecimal(text) ?? 'invalid';
}

/** The window being edited, in days, for the base-rate helper; null while a time is incomplete. */
function windowDays(openedLocal: string, closesLocal: string, timeZone: string): number | null {
  const opened = localToIso(openedLocal, timeZone);
  const closes = localToIso(closesLocal, timeZone);
  return opened && closes ? (Date.parse(closes) - Date.parse(opened)) / 86_400_000 : null;
}

function EditForm({ question: q, onClose, onSaved }: QuestionFormProps<BinaryQuestion>) {
  const form = useForm();
  const cancel = useCloseRequest(onClose);
  const initialOpened = isoToLocal(q.opened_at, q.time_zone);
  const edits = useCommonEdits(q);
  const { title, setTitle, rule, setRule, tags, setTags, baseRateNote, setBaseRateNote, timeZone, setTimeZone, closesLocal, setClosesLocal } = edits.fields;
  const [kind, setKind] = useState<QuestionKind>(q.kind);
  const [openedLocal, setOpenedLocal] = useState(initialOpened);
  const [baseRate, setBaseRate] = useState(percentText(q.base_rate));
  const [falseAlarm, setFalseAlarm] = useState(q.costs ? String(q.costs.false_alarm) : '');
  const [miss, setMiss] = useState(q.costs ? String(q.costs.miss) : '');
  const [checkin, setCheckin] = useState(q.checkin_days === null ? '' : String(q.checkin_days));
  const zones = useMemo(() => timeZoneNames(q.time_zone).map((zone) => ({ value: zone, label: zoneName(zone) })), [q.time_zone]);
  const initialCosts = { falseAlarm: q.costs ? String(q.costs.false_alarm) : '', miss: q.costs ? String(q.costs.miss) : '' };
  const dirty =
    edits.dirty || kind !== q.kind || openedLocal !== initialOpened || baseRate !== percentText(q.base_rate) ||
    falseAlarm !== initialCosts.falseAlarm || miss !== initialCosts.miss || checkin !== (q.checkin_days === null ? '' : String(q.checkin_days));

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const changes: QuestionChanges = {};
    edits.read(changes, found);
    if (kind !== q.kind) changes.kind = kind;
    // Like the close, the opening is re-read on a new zone's clocks.
    if (edits.zoneChanged || openedLocal !== initialOpened) {
      const iso = localToIso(openedLocal, timeZone);
      if (iso) changes.opened_at = iso;
      else found.opened_at = 'enter when the question opened';
      const problem = iso ? typedTimeProblem(iso, 'the opening time (when the question was posed)') : null;
      if (problem) found.opened_at = problem;
    }

    const base = percentToProbability(baseRate);
    if (!base.ok) found.base_rate = base.error;
    else if (base.value !== q.base_rate) changes.base_rate = base.value;

    const fa = numberOrBlank(falseAlarm);
    const mi = numberOrBlank(miss);
    if (fa === 'invalid') found['costs.false_alarm'] = 'must be a number, e.g. 1';
    if (mi === 'invalid') found['costs.miss'] = 'must be a number, e.g. 4';
    if (fa !== 'invalid' && mi !== 'invalid') {
      if ((fa === null) !== (mi === null)) {
        found[fa === null ? 'costs.false_alarm' : 'costs.miss'] = 'give both costs, or leave both empty to use the diary’s defaults';
      } else {
        const costs: Costs | null = fa === null || mi === null ? null : { false_alarm: fa, miss: mi };
        if (JSON.stringify(costs) !== JSON.stringify(q.costs)) changes.costs = costs;
      }
    }

    const days = numberOrBlank(checkin);
    if (days === 'invalid') found.checkin_days = 'must be a whole number of days';
    else if (days !== q.checkin_days) changes.checkin_days = days;

    // The window as it will be after the save, checked here because the diary checks it only
    // once every other field is right.
    const opened = changes.opened_at ?? q.opened_at;
    const closes = changes.closes_at ?? q.closes_at;
    if (!found.opened_at && !found.closes_at && Date.parse(closes) <= Date.parse(opened)) found.closes_at = 'must be after the opening time: choose a later close, or move “Opened” earlier';

    await saveQuestionChanges({ form, id: q.id, changes, found, placement: PLACEMENT, onClose, onSaved });
  }

  return (
    <Form form={form} label="Edit question" onSubmit={onSubmit} dirty={dirty}>
      <TextField label="Question" value={title} onChange={setTitle} required data-autofocus error={form.error('title')} />
      <TextArea label="Resolution rule" value={rule} onChange={setRule} rows={3} error={form.error('rule')} />
      <div className="form__row">
        <Select label="Kind" value={kind} options={KIND_OPTIONS} onChange={(v) => setKind(v as QuestionKind)} hint={kindHint(kind)} error={form.error('kind')} />
        <Select
          label="Time zone"
          value={timeZone}
          options={zones}
          onChange={setTimeZone}
          hint="The times below are read on this zone’s clocks."
          error={form.error('time_zone')}
        />
      </div>
      <div className="form__row">
        <DateTimeField label="Opened" local={openedLocal} onLocalChange={setOpenedLocal} timeZone={timeZone} required error={form.error('opened_at')} />
        <DateTimeField label="Closes" local={closesLocal} onLocalChange={setClosesLocal} timeZone={timeZone} required error={form.error('closes_at')} />
      </div>
      <div className="form__row">
        <ProbabilityInput label="Base rate" value={baseRate} onChange={setBaseRate} error={form.error('base_rate')} />
        <TextField label="Reference class" value={baseRateNote} onChange={setBaseRateNote} error={form.error('base_rate_note')} />
      </div>
      <BaseRateHelper
        windowDays={windowDays(openedLocal, closesLocal, timeZone)}
        onUse={(rate, note) => {
          setBaseRate(rate);
          setBaseRateNote(note);
        }}
      />
      <TagInput label="Tags" tags={tags} onChange={setTags} error={form.error('tags')} />
      <fieldset className="form__group">
        <legend>Costs of being wrong</legend>
        <p className="field__hint">How much worse a miss is than a false alarm sets the probability at which acting pays. Leave both empty to use the diary’s defaults.</p>
        <div className="form__row">
          <NumberField label="False-alarm cost" value={falseAlarm} onChange={setFalseAlarm} min={0} step="any" error={form.error('costs.false_alarm')} />
          <NumberField label="Miss cost" value={miss} onChange={setMiss} min={0} step="any" error={form.error('costs.miss')} />
        </div>
      </fieldset>
      <NumberField
        label="Check in every"
        value={checkin}
        onChange={setCheckin}
        suffix="days"
        min={0}
        max={365}
        step={1}
        hint="Empty: the diary’s default. 0: no check-in nudges."
        error={form.error('checkin_days')}
      />
      <FormActions cancel={cancel} busy={form.busy}>
        Save changes
      </FormActions>
    </Form>
  );
}
