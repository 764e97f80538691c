/**
 * How a choice question came out (pick the option that came true) or a numeric one (enter
 * the value), or Void (cannot be resolved fairly; never scored), when, and a note. Also used
 * to correct a resolution already recorded: the one it replaces is kept in the question's
 * history with the reason given here. As in the yes/no dialog, a resolution the diary finds
 * unusual is sent again only once the user has read why and agreed.
 */
import { useState, type FormEvent } from 'react';
import { resolveRequest } from '../../../../shared/contract';
import { fromStoredValue, toStoredValue } from '../../../../shared/numeric-value';
import { api } from '../../api/client';
import { ChoiceGroup } from '../../components/ChoiceGroup';
import { DateField } from '../../components/DateField';
import { useCloseRequest } from '../../components/Dialog';
import { Form } from '../../components/Form';
import { NumberField } from '../../components/NumberField';
import { formatValue, readValue } from '../../forecastEntry/numericEntry';
import { useForm } from '../../forms';
import { type NotesTyped, questionDialog, type QuestionFormProps, ResolutionNoteFields, resolveDialogFrame, useResolutionNotes, useSendResolution } from './questionForms';
import type { TypedQuestion } from './TypedEntryDialog';

const LABELS = { outcome: 'Outcome', option: 'Outcome', value: 'Value', at: 'Resolved at', note: 'Note', correction_note: 'Why the correction' };
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS };

export const TypedResolveDialog = questionDialog(ResolveForm, resolveDialogFrame);

/** The outcome choice as the radio group holds it: an option's index, "value", "void" or "". */
function initialChoice(question: TypedQuestion): string {
  const r = question.resolution;
  if (r === null) return question.type === 'numeric' ? 'value' : '';
  if (r.outcome === 'void') return 'void';
  return r.outcome === 'option' ? String(r.option) : 'value';
}

/** What the choice/numeric resolve form held when it saved (questionForms.tsx, `TypedInDialog`). */
export interface TypedResolveTyped {
  form: 'typed-resolve';
  choice: string;
  valueText: string;
  notes: NotesTyped;
}

function ResolveForm({ question, onClose, onSaved, restored }: QuestionFormProps<TypedQuestion>) {
  const form = useForm();
  const send = useSendResolution(form, PLACEMENT);
  const cancel = useCloseRequest(onClose);
  const current = question.resolution;
  const mine = restored?.form === 'typed-resolve' ? restored : undefined;
  const notes = useResolutionNotes(question, mine?.notes);
  const [initial] = useState(() => ({
    choice: initialChoice(question),
    value: current?.outcome === 'value' ? String(current.value) : '',
  }));
  const [choice, setChoice] = useState(mine?.choice ?? initial.choice);
  const [valueText, setValueText] = useState(mine?.valueText ?? initial.value);
  const dirty = choice !== initial.choice || valueText !== initial.value || notes.dirty;

  const choices =
    question.type === 'choice'
      ? [...question.options.map((label, k) => ({ value: String(k), label })), { value: 'void', label: 'Void — cannot be resolved fairly', tone: 'void' }]
      : [
          { value: 'value', label: question.value_kind === 'date' ? 'The date is known' : 'The value is known' },
          { value: 'void', label: 'Void — cannot be resolved fairly', tone: 'void' },
        ];

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const at = notes.readAt(found);
    let outcome: { outcome: 'void' } | { outcome: 'option'; option: number } | { outcome: 'value'; value: number | string } | null = null;
    if (choice === 'void') outcome = { outcome: 'void' };
    else if (question.type === 'choice') {
      if (choice === '') found.option = 'choose the option that came true, or Void';
      else outcome = { outcome: 'option', option: Number(choice) };
    } else {
      const read = readValue(valueText, question.value_kind);
      if (!read.ok) found.value = read.error;
      else if (read.value === null) found.value = question.value_kind === 'date' ? 'pick the date it happened' : 'enter the value it took';
      else outcome = { outcome: 'value', value: fromStoredValue(read.value, question.value_kind) };
    }
    const extra = notes.extra(at);
    // With "The value is known" picked but no value yet, the outcome itself is settled: only
    // the value box is marked, not the outcome with the contract's list of every outcome kind.
    const request = { id: question.id, ...(outcome ?? { outcome: choice === 'value' ? 'value' : '' }), ...extra };
    if (!form.check(found, { schema: resolveRequest, request, placement: PLACEMENT }) || outcome === null) return;
    const chosen = outcome;
    const undo = await send(`Resolve ${outcomeText(question, chosen)} anyway`, (confirm) =>
      api.resolveQuestion({ id: question.id, ...chosen, ...extra, ...(confirm ? { confirm } : {}) }),
    );
    if (undo !== null)
      onSaved(`${current ? 'Resolution corrected to' : 'Resolved:'} ${outcomeText(question, chosen)}.`, undo, { form: 'typed-resolve', choice, valueText, notes: notes.typed() });
  }

  return (
    <Form form={form} label="Resolution" onSubmit={onSubmit} dirty={dirty}>
      <ChoiceGroup
        legend={question.type === 'choice' ? 'Which option came true?' : 'Outcome'}
        value={choice}
        choices={choices}
        onChange={setChoice}
        error={form.error('option') ?? form.error('outcome')}
      />
      {question.type === 'numeric' && choice === 'value' ? (
        question.value_kind === 'date' ? (
          <DateField label="Date it happened" value={valueText} onChange={setValueText} error={form.error('value')} />
        ) : (
          <NumberField label="Value" value={valueText} onChange={setValueText} suffix={question.unit || undefined} step="any" required error={form.error('value')} />
        )
      ) : null}
      {choice === 'void' ? <p className="field__hint">Void questions are never scored.</p> : null}
      <ResolutionNoteFields question={question} notes={notes} form={form} cancel={cancel} />
    </Form>
  );
}

/** "Ambledene", "16.5 weeks", "2026-03-31" or "Void". */
export function outcomeText(
  question: TypedQuestion,
  outcome: { outcome: 'void' } | { outcome: 'option'; option: number } | { outcome: 'value'; value: number | string },
): string {
  if (outcome.outcome === 'void') return 'Void';
  if (outcome.outcome === 'option') return question.type === 'choice' ? (question.options[outcome.option] ?? `option ${outcome.option + 1}`) : '';
  return question.type === 'numeric' ? formatValue(toStoredValue(outcome.value, question.value_kind), question.value_kind, question.unit) : '';
}
