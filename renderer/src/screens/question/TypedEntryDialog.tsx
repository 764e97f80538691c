/**
 * A new revision of your own forecast, or a reference forecast from an outside source, for a
 * choice question (a percentage per option) or a numeric question (a value per quantile
 * level). The yes/no question keeps its own dialogs (ReviseDialog, ReferenceDialog), with
 * lenses and the recalibration hint that only apply to a single probability.
 */
import { useState, type FormEvent } from 'react';
import { forecastRequest, referenceRequest } from '../../../../shared/contract';
import type { ChoiceQuestion, NumericQuestion } from '../../../../shared/domain';
import { fromStoredValue, toStoredValue } from '../../../../shared/numeric-value';
import { api } from '../../api/client';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog, useCloseRequest } from '../../components/Dialog';
import { Form, FormActions } from '../../components/Form';
import { TextArea } from '../../components/TextArea';
import { TextField } from '../../components/TextField';
import { localToIso } from '../../dates';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import { useForm } from '../../forms';
import { percentText } from '../../percent';
import { ChoiceForecastInput } from '../../forecastEntry/ChoiceForecastInput';
import { readChoiceForecast, type ChoiceProblems } from '../../forecastEntry/choiceEntry';
import { NumericForecastInput } from '../../forecastEntry/NumericForecastInput';
import { formatValue, readNumericForecast, type NumericProblems } from '../../forecastEntry/numericEntry';
import { choiceSummary } from '../../questionTypes/summaries';
import { latestEntry, repeatsLatest } from './typedFacts';
import type { QuestionDialogProps } from './questionForms';

export type TypedQuestion = ChoiceQuestion | NumericQuestion;

interface Props extends QuestionDialogProps<TypedQuestion> {
  /** A revision of your own forecast, or a reference forecast. */
  mode: 'forecast' | 'reference';
}

/** What the choice/numeric revise or reference form held when it saved (questionForms.tsx, `TypedInDialog`). */
export interface TypedEntryTyped {
  form: 'typed-entry';
  mode: Props['mode'];
  texts: string[];
  note: string;
  source: string;
  atLocal: string;
}

export function TypedEntryDialog({ question, mode, open, onClose, onSaved, restored }: Props) {
  const title = mode === 'forecast' ? 'Revise your forecast' : 'Add a reference forecast';
  return (
    <Dialog open={open} onClose={onClose} title={title} description={question.title}>
      <EntryForm question={question} mode={mode} onClose={onClose} onSaved={onSaved} restored={restored} />
    </Dialog>
  );
}

/** The boxes a new entry starts from: your latest forecast (a revision usually changes a little). */
function initialTexts(question: TypedQuestion, mode: Props['mode']): string[] {
  if (question.type === 'choice') {
    const last = mode === 'forecast' ? latestEntry(question.forecasts) : undefined;
    return question.options.map((_, k) => (last ? percentText(last.probs[k]) : ''));
  }
  const last = mode === 'forecast' ? latestEntry(question.forecasts) : undefined;
  return question.levels.map((_, k) => {
    const value = last?.quantiles[k];
    return value === undefined ? '' : String(value);
  });
}

function EntryForm({ question, mode, onClose, onSaved, restored }: Omit<Props, 'open'>) {
  const form = useForm();
  const cancel = useCloseRequest(onClose);
  // Boxes given back only to the same kind of entry, with one per option or level as now.
  const mine = restored?.form === 'typed-entry' && restored.mode === mode ? restored : undefined;
  const [initial] = useState(() => initialTexts(question, mode));
  const [texts, setTexts] = useState(mine && mine.texts.length === initial.length ? mine.texts : initial);
  const [note, setNote] = useState(mine?.note ?? '');
  const [source, setSource] = useState(mine?.source ?? '');
  const [atLocal, setAtLocal] = useState(mine?.atLocal ?? '');
  const [problems, setProblems] = useState<ChoiceProblems | NumericProblems | undefined>(undefined);
  // Typed into since the last save attempt: the form's reason for the boxes is stale then.
  const [edited, setEdited] = useState(false);
  const valueField = question.type === 'choice' ? 'probs' : 'quantiles';
  const labels = { [valueField]: mode === 'forecast' ? 'Your forecast' : 'Their forecast', note: 'What changed', source: 'Source', at: 'As of' };
  const placement = { fields: Object.keys(labels), labels };
  const dirty = texts.some((t, k) => t !== initial[k]) || note !== '' || source !== '' || atLocal !== '';

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    setEdited(false);
    const found: Record<string, string> = {};
    const at = atLocal ? localToIso(atLocal, question.time_zone) : null;
    if (atLocal && !at) found.at = 'enter a complete date and time, or leave it empty for now';
    const atProblem = at ? typedTimeProblem(at, mode === 'forecast' ? 'a revision' : 'a reference forecast', question) : null;
    if (atProblem) found.at = atProblem;
    if (mode === 'reference' && source.trim() === '') found.source = 'name the source, e.g. “client’s view”';
    let value: { probs: number[] } | { quantiles: (number | string)[] } | null = null;
    if (question.type === 'choice') {
      const read = readChoiceForecast(texts);
      setProblems(read.problems);
      if (read.ok) value = { probs: read.value };
      else found.probs = read.error;
    } else {
      const read = readNumericForecast(texts, question.levels, question.value_kind, question.unit);
      setProblems(read.problems);
      if (read.ok) value = { quantiles: read.value.map((v) => fromStoredValue(v, question.value_kind)) };
      else found.quantiles = read.error;
    }
    const common = { question_id: question.id, ...(value ?? {}), ...(at ? { at } : {}) };
    const request = mode === 'forecast' ? { ...common, note } : { ...common, source };
    const schema = mode === 'forecast' ? forecastRequest : referenceRequest;
    if (!form.check(found, { schema, request, placement }) || value === null) return;
    let undo = '';
    const ok = await form.submit(async () => {
      undo = (mode === 'forecast' ? await api.addForecast({ ...common, note }) : await api.addReference({ ...common, source })).undo;
    }, placement);
    if (!ok) return;
    const typed: TypedEntryTyped = { form: 'typed-entry', mode, texts, note, source, atLocal };
    if (mode === 'reference') onSaved(`Reference from ${source.trim()}: ${entryText(question, value)}.`, undo, typed);
    // The same numbers now confirm the forecast: said as the yes/no Desk says it.
    else if (!at && repeatsLatest(question, value)) onSaved(`Kept at ${entryText(question, value)}; check-in done.`, undo, typed);
    else onSaved(`Revised to ${entryText(question, value)}.`, undo, typed);
  }

  // The contract's or the service's reason for the whole vector shows under the boxes.
  const shownProblems = problems ?? (!edited && form.error(valueField) ? { options: {}, levels: {}, total: form.error(valueField), order: form.error(valueField) } : undefined);
  return (
    <Form form={form} label={mode === 'forecast' ? 'Revise your forecast' : 'Reference forecast'} onSubmit={onSubmit} dirty={dirty}>
      {mode === 'reference' ? (
        <TextField label="Source" value={source} onChange={setSource} required data-autofocus placeholder="e.g. client’s view, vendor plan" error={form.error('source')} />
      ) : null}
      {question.type === 'choice' ? (
        <ChoiceForecastInput
          label={mode === 'forecast' ? 'Your chances' : 'Their chances'}
          options={question.options}
          value={texts}
          onChange={(next) => {
            setProblems(undefined);
            setEdited(true);
            setTexts(next);
          }}
          problems={shownProblems as ChoiceProblems | undefined}
          hint="A chance for each option, in percent; together they make 100%."
          autoFocus={mode === 'forecast'}
        />
      ) : (
        <NumericForecastInput
          label={mode === 'forecast' ? 'Your range' : 'Their range'}
          levels={question.levels}
          kind={question.value_kind}
          unit={question.unit}
          value={texts}
          onChange={(next) => {
            setProblems(undefined);
            setEdited(true);
            setTexts(next);
          }}
          problems={shownProblems as NumericProblems | undefined}
          autoFocus={mode === 'forecast'}
        />
      )}
      {mode === 'forecast' ? (
        <TextArea label="What changed" value={note} onChange={setNote} hint="The evidence behind the new numbers, in a line or two." error={form.error('note')} />
      ) : null}
      <DateTimeField
        label="As of"
        local={atLocal}
        onLocalChange={setAtLocal}
        timeZone={question.time_zone}
        hint="Leave empty for now; set it to record an earlier call."
        error={form.error('at')}
      />
      <FormActions cancel={cancel} busy={form.busy}>
        {mode === 'forecast' ? 'Save revision' : 'Add reference'}
      </FormActions>
    </Form>
  );
}

/** The saved entry in a few words, for the toast. */
function entryText(question: TypedQuestion, value: { probs: number[] } | { quantiles: (number | string)[] }): string {
  if (question.type === 'choice' && 'probs' in value) return choiceSummary(question.options, value.probs);
  if (question.type === 'numeric' && 'quantiles' in value) {
    const median = value.quantiles[question.levels.indexOf(0.5)];
    return median === undefined ? '' : `median ${formatValue(toStoredValue(median, question.value_kind), question.value_kind, question.unit)}`;
  }
  return '';
}
