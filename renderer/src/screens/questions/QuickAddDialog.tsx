/**
 * The one-minute question: title, rule, close, base rate, a first probability and tags, and
 * (optional) when it was posed, so a call already made, or a window already closed, is
 * recorded honestly; left empty, the question opens now. The rest (costs, check-in
 * cadence) can be filled in later from Edit.
 */
import { useEffect, useState, type FormEvent } from 'react';
import { createQuestionRequest } from '../../../../shared/contract';
import type { QuestionKind } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog, useCloseRequest } from '../../components/Dialog';
import { Form, FormActions } from '../../components/Form';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { Select } from '../../components/Select';
import { TagInput } from '../../components/TagInput';
import { TextArea } from '../../components/TextArea';
import { TextField } from '../../components/TextField';
import { useToast } from '../../components/Toast';
import { localToIso } from '../../dates';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import { useDefaultTimeZone } from '../../diaryInfo';
import { useForm } from '../../forms';
import { percentToProbability } from '../../percent';
import { hrefTo, questionPath } from '../../routing';
import { BaseRateHelper } from '../../tools/BaseRateHelper';
import { KIND_OPTIONS, kindHint } from '../question/labels';
import { useTypedDraft } from '../../questionTypes/TypedQuestionFields';

const LABELS = {
  title: 'Question',
  rule: 'Resolution rule',
  kind: 'Kind',
  closes_at: 'Closes',
  opened_at: 'Opened',
  time_zone: 'Time zone',
  base_rate: 'Base rate',
  base_rate_note: 'Reference class',
  'first_forecast.p': 'Your probability',
  type: 'Type of answer',
  options: 'Options',
  option_base_rates: 'Option base rates (optional)',
  'first_forecast.probs': 'Your chances',
  unit: 'Unit',
  value_kind: 'Value',
  levels: 'Levels',
  'first_forecast.quantiles': 'Your range',
  'first_forecast.at': 'Opened',
  'first_forecast.note': 'Reasoning',
  tags: 'Tags',
};
// The first forecast is dated at the opening typed, so a reason about its time is one about "Opened".
const PLACEMENT = { fields: Object.keys(LABELS).filter((f) => f !== 'first_forecast.at'), labels: LABELS, aliases: { 'first_forecast.at': 'opened_at' } };

/** What the rule must pin down: a choice or numeric question has no Yes to count. */
const RULE_HINTS = {
  binary: 'What exactly counts as Yes, so future-you cannot wriggle.',
  choice: 'What decides which option came true, so future-you cannot wriggle.',
  numeric: 'Where the number or date will be read off, so future-you cannot wriggle.',
} as const;

export function QuickAddDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  return (
    <Dialog open={open} onClose={onClose} title="New question" size="lg" description="Write the call down now; add detail later from Edit.">
      <QuickAddForm onDone={onClose} />
    </Dialog>
  );
}

/** Days from now to the close being typed, for the base-rate helper; null until it is complete. */
function windowDays(closesLocal: string, timeZone: string): number | null {
  const closes = localToIso(closesLocal, timeZone);
  return closes ? (Date.parse(closes) - Date.now()) / 86_400_000 : null;
}

function QuickAddForm({ onDone }: { onDone: () => void }) {
  const defaultZone = useDefaultTimeZone();
  const toast = useToast();
  const form = useForm();
  const cancel = useCloseRequest(onDone);
  const [title, setTitle] = useState('');
  const [rule, setRule] = useState('');
  const [kind, setKind] = useState<QuestionKind>('event_by_deadline');
  const [closesLocal, setClosesLocal] = useState('');
  const [openedLocal, setOpenedLocal] = useState('');
  // The zone the user chose, if any; until then the diary's, which may arrive after the form
  // opens (a form that copied it at opening kept this computer's zone and, once the diary's
  // came, counted itself as changed and asked to discard an untouched form).
  const [chosenZone, setTimeZone] = useState<string | null>(null);
  const timeZone = chosenZone ?? defaultZone;
  const [baseRate, setBaseRate] = useState('');
  const [baseRateNote, setBaseRateNote] = useState('');
  const [firstP, setFirstP] = useState('');
  const [firstNote, setFirstNote] = useState('');
  const [tags, setTags] = useState<string[]>([]);
  const [knownTags, setKnownTags] = useState<string[]>([]);
  const typed = useTypedDraft();

  useEffect(() => {
    api.listTags({}).then(
      (list) => setKnownTags(list.tags.map((t) => t.tag)),
      () => setKnownTags([]),
    );
  }, []);

  const dirty =
    title !== '' || rule !== '' || kind !== 'event_by_deadline' || closesLocal !== '' || openedLocal !== '' || (chosenZone !== null && chosenZone !== defaultZone) ||
    baseRate !== '' || baseRateNote !== '' || firstP !== '' || firstNote !== '' || tags.length > 0 || typed.dirty;

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    // Stated explicitly (now, when left empty) so a close before it is refused beside the close field.
    const typedOpening = openedLocal !== '';
    const openedAt = typedOpening ? localToIso(openedLocal, timeZone) : new Date().toISOString();
    if (title.trim() === '') found.title = 'write the question you are forecasting, e.g. “Northgate signs phase 2 by 31 March”';
    if (!openedAt) found.opened_at = 'enter a complete date and time, or leave it empty for now';
    else if (typedOpening) {
      const problem = typedTimeProblem(openedAt, 'the opening time (when the question was posed)');
      if (problem) found.opened_at = problem;
    }
    const closesAt = localToIso(closesLocal, timeZone);
    if (!closesAt) found.closes_at = 'choose the date and time the window closes';
    else if (openedAt && Date.parse(closesAt) <= Date.parse(openedAt))
      found.closes_at = typedOpening ? 'must be after the opening time (“Opened”)' : 'must be after the opening time: the question opens now, so the close must be in the future (for a call made earlier, fill in “Opened”)';
    // A choice or numeric question takes its own fields; the yes/no base rate and probability do not apply.
    const binary = typed.type === 'binary';
    const base = binary ? percentToProbability(baseRate) : ({ ok: true, value: null } as const);
    if (!base.ok) found.base_rate = base.error;
    const first = binary ? percentToProbability(firstP) : ({ ok: true, value: null } as const);
    if (!first.ok) found['first_forecast.p'] = first.error;
    else if (binary && first.value === null && firstNote.trim() !== '') found['first_forecast.p'] = 'give the probability your reasoning is for, or clear the reasoning';
    const own = typed.read(found);
    if (!binary && own.first === null && firstNote.trim() !== '') {
      found[typed.type === 'choice' ? 'first_forecast.probs' : 'first_forecast.quantiles'] = 'give the forecast your reasoning is for, or clear the reasoning';
    }
    const request = {
      ...own.fields,
      title,
      rule,
      kind,
      tags,
      opened_at: openedAt ?? '',
      closes_at: closesAt ?? '',
      time_zone: timeZone,
      base_rate: base.ok ? base.value : null,
      base_rate_note: baseRateNote,
      // A call made earlier was made when it was posed: the first forecast is dated then too.
      ...(first.ok && first.value !== null ? { first_forecast: { p: first.value, note: firstNote, ...(typedOpening && openedAt ? { at: openedAt } : {}) } } : {}),
      ...(own.first ? { first_forecast: { ...own.first, note: firstNote, ...(typedOpening && openedAt ? { at: openedAt } : {}) } } : {}),
    };
    if (!form.check(found, { schema: createQuestionRequest, request, placement: PLACEMENT })) return;

    const ok = await form.submit(async () => {
      const created = await api.createQuestion(request);
      diaryChanged();
      toast.show({ message: `Added “${created.title}”.`, action: { label: 'Open the question', href: hrefTo(questionPath(created.id)) } });
    }, PLACEMENT);
    if (ok) onDone();
  }

  return (
    <Form form={form} label="New question" onSubmit={onSubmit} dirty={dirty}>
      <TextField
        label="Question"
        value={title}
        onChange={setTitle}
        required
        data-autofocus
        placeholder="e.g. Northgate signs the phase-2 statement of work"
        error={form.error('title')}
      />
      <TextArea
        label="Resolution rule"
        value={rule}
        onChange={setRule}
        rows={2}
        hint={RULE_HINTS[typed.type]}
        error={form.error('rule')}
      />
      <DateTimeField
        label="Closes"
        local={closesLocal}
        onLocalChange={setClosesLocal}
        timeZone={timeZone}
        onTimeZoneChange={setTimeZone}
        required
        error={form.error('closes_at') ?? form.error('time_zone')}
      />
      <DateTimeField
        label="Opened"
        local={openedLocal}
        onLocalChange={setOpenedLocal}
        timeZone={timeZone}
        hint="Leave empty if you are posing it now. For a call you made earlier, give when you made it: your first forecast is dated then too."
        error={form.error('opened_at')}
      />
      {typed.typeChoice(form.error('type'))}
      {typed.fields(form.error)}
      {typed.type === 'binary' ? (
        <>
          <div className="form__row">
            <ProbabilityInput
              label="Base rate"
              value={baseRate}
              onChange={setBaseRate}
              hint="How often comparable cases came out Yes."
              error={form.error('base_rate')}
            />
            <TextField
              label="Reference class"
              value={baseRateNote}
              onChange={setBaseRateNote}
              placeholder="e.g. 6 of 20 comparable renewals slipped"
              error={form.error('base_rate_note')}
            />
          </div>
          <BaseRateHelper
            windowDays={windowDays(closesLocal, timeZone)}
            onUse={(rate, note) => {
              setBaseRate(rate);
              setBaseRateNote(note);
            }}
          />
          <div className="form__row">
            <ProbabilityInput
              label="Your probability"
              value={firstP}
              onChange={setFirstP}
              hint="Your first forecast; revise it as evidence arrives."
              error={form.error('first_forecast.p')}
            />
            <TextField label="Reasoning" value={firstNote} onChange={setFirstNote} error={form.error('first_forecast.note')} />
          </div>
        </>
      ) : (
        <TextField label="Reasoning" value={firstNote} onChange={setFirstNote} error={form.error('first_forecast.note')} />
      )}
      <div className="form__row">
        <Select
          label="Kind"
          value={kind}
          options={KIND_OPTIONS}
          onChange={(value) => setKind(value as QuestionKind)}
          hint={kindHint(kind)}
          error={form.error('kind')}
        />
        <TagInput label="Tags" tags={tags} onChange={setTags} suggestions={knownTags} error={form.error('tags')} />
      </div>
      <FormActions cancel={cancel} busy={form.busy}>
        Save question
      </FormActions>
    </Form>
  );
}
