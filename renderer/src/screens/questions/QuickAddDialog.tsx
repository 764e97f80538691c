/**
 * The one-minute question: title, rule, close, base rate, a first probability and tags.
 * The rest (costs, check-in cadence, opening time) can be filled in later from Edit.
 */
import { useEffect, useState, type FormEvent } from 'react';
import type { QuestionKind } from '../../../../shared/domain';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { Button } from '../../components/Button';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog } from '../../components/Dialog';
import { ErrorBanner } from '../../components/ErrorBanner';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { Select } from '../../components/Select';
import { TagInput } from '../../components/TagInput';
import { TextArea } from '../../components/TextArea';
import { TextField } from '../../components/TextField';
import { useToast } from '../../components/Toast';
import { localToIso } from '../../dates';
import { useDefaultTimeZone } from '../../diaryInfo';
import { useForm } from '../../forms';
import { percentToProbability } from '../../percent';
import { hrefTo, questionPath } from '../../routing';
import { BaseRateHelper } from '../../tools/BaseRateHelper';
import { KIND_OPTIONS, kindHint } from '../question/labels';

const FIELDS = ['title', 'rule', 'kind', 'closes_at', 'time_zone', 'base_rate', 'base_rate_note', 'first_forecast.p', 'first_forecast.note', 'tags'];

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
  const [title, setTitle] = useState('');
  const [rule, setRule] = useState('');
  const [kind, setKind] = useState<QuestionKind>('event_by_deadline');
  const [closesLocal, setClosesLocal] = useState('');
  const [timeZone, setTimeZone] = useState(defaultZone);
  const [baseRate, setBaseRate] = useState('');
  const [baseRateNote, setBaseRateNote] = useState('');
  const [firstP, setFirstP] = useState('');
  const [firstNote, setFirstNote] = useState('');
  const [tags, setTags] = useState<string[]>([]);
  const [knownTags, setKnownTags] = useState<string[]>([]);

  useEffect(() => {
    api.listQuestions({}).then(
      (list) => setKnownTags(list.tags.map((t) => t.tag)),
      () => setKnownTags([]),
    );
  }, []);

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const closesAt = localToIso(closesLocal, timeZone);
    if (!closesAt) found.closes_at = 'choose the date and time the window closes';
    const base = percentToProbability(baseRate);
    if (!base.ok) found.base_rate = base.error;
    const first = percentToProbability(firstP);
    if (!first.ok) found['first_forecast.p'] = first.error;
    if (!closesAt || !base.ok || !first.ok) return void form.reject(found);

    const ok = await form.submit(
      async () => {
        const created = await api.createQuestion({
          title,
          rule,
          kind,
          tags,
          // Stated explicitly so a close in the past is refused beside the close field.
          opened_at: new Date().toISOString(),
          closes_at: closesAt,
          time_zone: timeZone,
          base_rate: base.value,
          base_rate_note: baseRateNote,
          ...(first.value !== null ? { first_forecast: { p: first.value, note: firstNote } } : {}),
        });
        diaryChanged();
        toast.show({ message: `Added “${created.title}”.`, action: { label: 'Open the question', href: hrefTo(questionPath(created.id)) } });
      },
      { fields: FIELDS, aliases: { opened_at: 'closes_at' } },
    );
    if (ok) onDone();
  }

  return (
    <form ref={form.formRef} className="form" noValidate onSubmit={onSubmit} aria-label="New question">
      {form.banner ? <ErrorBanner message={form.banner.message} details={form.banner.details} /> : null}
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
        hint="What exactly counts as Yes, so future-you cannot wriggle."
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
      <div className="form__actions">
        <Button onClick={onDone}>Cancel</Button>
        <Button type="submit" variant="primary" busy={form.busy}>
          Save question
        </Button>
      </div>
    </form>
  );
}
