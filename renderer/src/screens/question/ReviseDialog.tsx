/**
 * A new revision of the user's own probability, with the reason for the change, optional
 * lenses (perspective estimates pooled into a suggestion) and a reminder of what the stated
 * number has meant in the user's resolved record.
 */
import { useState, type FormEvent } from 'react';
import { forecastRequest } from '../../../../shared/contract';
import type { BinaryQuestion } from '../../../../shared/domain';
import { api } from '../../api/client';
import { DateTimeField } from '../../components/DateTimeField';
import { useCloseRequest } from '../../components/Dialog';
import { Form, FormActions } from '../../components/Form';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { TextArea } from '../../components/TextArea';
import { localToIso } from '../../dates';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import { useForm } from '../../forms';
import { percentText, percentToProbability } from '../../percent';
import { LensesEditor } from '../../tools/LensesEditor';
import { checkLenses, type LensDraft } from '../../tools/lenses';
import { RecalibrationHint } from '../../tools/RecalibrationHint';
import { lastForecast } from './questionFacts';
import { questionDialog, type QuestionFormProps } from './questionForms';

export const ReviseDialog = questionDialog(ReviseForm, (question) => ({ title: 'Revise your forecast', description: question.title }));

const LABELS = { p: 'Your probability', note: 'What changed', at: 'As of', lenses: 'Lenses' };
const PLACEMENT = { fields: ['p', 'note', 'at'], labels: LABELS };

/** What the yes/no revise form held when it saved (questionForms.tsx, `TypedInDialog`). */
export interface ReviseTyped {
  form: 'revise';
  p: string;
  note: string;
  atLocal: string;
  lenses: LensDraft[];
  extremize: string;
}

function ReviseForm({ question, onClose, onSaved, restored }: QuestionFormProps<BinaryQuestion>) {
  const form = useForm();
  const cancel = useCloseRequest(onClose);
  const mine = restored?.form === 'revise' ? restored : undefined;
  const [initialP] = useState(() => percentText(lastForecast(question)?.p));
  const [p, setP] = useState(mine?.p ?? initialP);
  const [note, setNote] = useState(mine?.note ?? '');
  const [atLocal, setAtLocal] = useState(mine?.atLocal ?? '');
  const [lenses, setLenses] = useState<LensDraft[]>(mine?.lenses ?? []);
  const [extremize, setExtremize] = useState(mine?.extremize ?? '1');
  const stated = percentToProbability(p);
  const dirty = p !== initialP || note !== '' || atLocal !== '' || lenses.length > 0 || extremize !== '1';

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const parsed = percentToProbability(p);
    const at = atLocal ? localToIso(atLocal, question.time_zone) : null;
    if (!parsed.ok) found.p = parsed.error;
    else if (parsed.value === null) found.p = 'enter your probability in percent, e.g. 35';
    if (atLocal && !at) found.at = 'enter a complete date and time, or leave it empty for now';
    const atProblem = at ? typedTimeProblem(at, 'a revision', question) : null;
    if (atProblem) found.at = atProblem;
    const checked = checkLenses(lenses);
    Object.assign(found, checked.errors);
    const request = {
      question_id: question.id,
      p: parsed.ok && parsed.value !== null ? parsed.value : Number.NaN,
      note,
      ...(at ? { at } : {}),
      ...(checked.lenses.length ? { lenses: checked.lenses } : {}),
    };
    if (!form.check(found, { schema: forecastRequest, request, placement: PLACEMENT })) return;
    let undo = '';
    const ok = await form.submit(async () => {
      undo = (await api.addForecast(request)).undo;
    }, PLACEMENT);
    if (ok) onSaved(`Revised to ${p.trim()}%.`, undo, { form: 'revise', p, note, atLocal, lenses, extremize });
  }

  return (
    <Form form={form} label="Revise your forecast" onSubmit={onSubmit} dirty={dirty}>
      <ProbabilityInput label="Your probability" value={p} onChange={setP} required autoFocus error={form.error('p')} />
      <RecalibrationHint p={stated.ok ? stated.value : null} />
      <LensesEditor
        lenses={lenses}
        onLensesChange={setLenses}
        extremize={extremize}
        onExtremizeChange={setExtremize}
        onUseSuggestion={setP}
        error={form.error}
      />
      <TextArea label="What changed" value={note} onChange={setNote} hint="The evidence behind the new number, in a line or two." error={form.error('note')} />
      <DateTimeField
        label="As of"
        local={atLocal}
        onLocalChange={setAtLocal}
        timeZone={question.time_zone}
        hint="Leave empty for now; set it to back-date a call you made earlier."
        error={form.error('at')}
      />
      <FormActions cancel={cancel} busy={form.busy}>
        Save revision
      </FormActions>
    </Form>
  );
}
