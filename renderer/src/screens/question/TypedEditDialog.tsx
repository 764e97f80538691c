/**
 * Editing a choice or numeric question: its wording, close, tags, a choice question's option
 * labels (the number of options is fixed), ordering and option base rates, a numeric
 * question's unit. The type, a numeric question's value kind and levels are fixed at
 * creation, because every revision is written over them; the dialog says so.
 */
import { useState, type FormEvent } from 'react';
import { formatInstant } from '../../dates';
import { DateTimeField } from '../../components/DateTimeField';
import { useCloseRequest } from '../../components/Dialog';
import { Form, FormActions } from '../../components/Form';
import { TagInput } from '../../components/TagInput';
import { TextArea } from '../../components/TextArea';
import { TextField } from '../../components/TextField';
import { ChoiceForecastInput } from '../../forecastEntry/ChoiceForecastInput';
import type { ChoiceProblems } from '../../forecastEntry/choiceEntry';
import { useForm } from '../../forms';
import { type QuestionChanges, questionDialog, type QuestionFormProps, saveQuestionChanges, useCommonEdits } from './questionForms';
import { percentText } from '../../percent';
import { levelsText, readOptionBaseRates, readOptions } from '../../questionTypes/definition';
import { OptionsEditor } from '../../questionTypes/OptionsEditor';
import type { TypedQuestion } from './TypedEntryDialog';

const LABELS = {
  title: 'Question',
  rule: 'Resolution rule',
  closes_at: 'Closes',
  time_zone: 'Time zone',
  tags: 'Tags',
  options: 'Options',
  ordered: 'Ordered options',
  option_base_rates: 'Option base rates',
  base_rate_note: 'Where the base rates come from',
  unit: 'Unit',
};
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS, prefix: 'changes' };

export const TypedEditDialog = questionDialog(EditForm, () => ({ title: 'Edit question', size: 'lg' }));

const same = (a: readonly unknown[] | null, b: readonly unknown[] | null) => JSON.stringify(a) === JSON.stringify(b);

function EditForm({ question: q, onClose, onSaved }: QuestionFormProps<TypedQuestion>) {
  const form = useForm();
  const cancel = useCloseRequest(onClose);
  const initialRates = q.type === 'choice' ? q.options.map((_, k) => percentText(q.option_base_rates?.[k])) : [];
  const edits = useCommonEdits(q);
  const { title, setTitle, rule, setRule, tags, setTags, baseRateNote, setBaseRateNote, timeZone, setTimeZone, closesLocal, setClosesLocal } = edits.fields;
  const [options, setOptions] = useState<string[]>(q.type === 'choice' ? q.options : []);
  const [ordered, setOrdered] = useState(q.type === 'choice' && q.ordered);
  const [rates, setRates] = useState<string[]>(initialRates);
  const [ratesProblems, setRatesProblems] = useState<ChoiceProblems | undefined>(undefined);
  const [optionProblems, setOptionProblems] = useState<Record<number, string> | undefined>(undefined);
  const [unit, setUnit] = useState(q.type === 'numeric' ? q.unit : '');
  const dirty =
    edits.dirty ||
    (q.type === 'choice' && (!same(options, q.options) || ordered !== q.ordered || !same(rates, initialRates))) ||
    (q.type === 'numeric' && unit !== q.unit);

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const changes: QuestionChanges = {};
    edits.read(changes, found);
    // The opening is not in this dialog, so the message says when it was.
    if (changes.closes_at && Date.parse(changes.closes_at) <= Date.parse(q.opened_at)) {
      found.closes_at = `must be after the question opened (${formatInstant(q.opened_at, timeZone)}): choose a later close`;
    }
    if (q.type === 'choice') {
      const read = readOptions(options);
      setOptionProblems(read.problems);
      if (!read.ok) found.options = read.error;
      else if (!same(read.value, q.options)) changes.options = read.value;
      if (ordered !== q.ordered) changes.ordered = ordered;
      const base = readOptionBaseRates(rates);
      setRatesProblems(base.problems);
      if (!base.ok) found.option_base_rates = base.error;
      else if (!same(base.value, q.option_base_rates)) changes.option_base_rates = base.value;
    } else if (unit !== q.unit) {
      changes.unit = unit;
    }
    await saveQuestionChanges({ form, id: q.id, changes, found, placement: PLACEMENT, onClose, onSaved });
  }

  return (
    <Form form={form} label="Edit question" onSubmit={onSubmit} dirty={dirty}>
      <p className="field__hint" data-testid="type-fixed">
        {q.type === 'choice'
          ? `Multiple choice with ${q.options.length} options. The type and the number of options are fixed once the question exists.`
          : `${q.value_kind === 'date' ? 'A date' : 'A number'}, forecast as ${levelsText(q.levels)}. The type, the value kind and the levels are fixed once the question exists.`}
      </p>
      <TextField label="Question" value={title} onChange={setTitle} required data-autofocus error={form.error('title')} />
      <TextArea label="Resolution rule" value={rule} onChange={setRule} rows={2} error={form.error('rule')} />
      <DateTimeField
        label="Closes"
        local={closesLocal}
        onLocalChange={setClosesLocal}
        timeZone={timeZone}
        onTimeZoneChange={setTimeZone}
        required
        error={form.error('closes_at') ?? form.error('time_zone')}
      />
      {q.type === 'choice' ? (
        <>
          <OptionsEditor value={options} onChange={setOptions} problems={optionProblems} error={form.error('options')} fixedCount />
          <label className="checkbox-field">
            <input type="checkbox" checked={ordered} onChange={(event) => setOrdered(event.target.checked)} />
            Ordered options (e.g. ranges of a quantity, or early / on time / late): scored by the ranked probability score too
          </label>
          <ChoiceForecastInput
            label="Option base rates (optional)"
            options={options.map((o, k) => o.trim() || `Option ${k + 1}`)}
            value={rates}
            onChange={(next) => {
              setRatesProblems(undefined);
              setRates(next);
            }}
            problems={ratesProblems ?? (form.error('option_base_rates') ? { options: {}, total: form.error('option_base_rates') } : undefined)}
            hint="How often each option comes true in comparable cases; leave all blank if you have no reference class."
          />
          <TextField label="Where the base rates come from" value={baseRateNote} onChange={setBaseRateNote} error={form.error('base_rate_note')} />
        </>
      ) : (
        <TextField label="Unit" value={unit} onChange={setUnit} hint="Shown beside every value, e.g. weeks or £k." error={form.error('unit')} />
      )}
      <TagInput label="Tags" tags={tags} onChange={setTags} error={form.error('tags')} />
      <FormActions cancel={cancel} busy={form.busy}>
        Save changes
      </FormActions>
    </Form>
  );
}
