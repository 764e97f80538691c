/** A probability from a named outside source (a client's view, a consensus figure). */
import { useId, useState, type FormEvent } from 'react';
import { referenceRequest } from '../../../../shared/contract';
import type { Question } from '../../../../shared/domain';
import { api } from '../../api/client';
import { DateTimeField } from '../../components/DateTimeField';
import { useCloseRequest } from '../../components/Dialog';
import { Form, FormActions } from '../../components/Form';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { TextField } from '../../components/TextField';
import { localToIso } from '../../dates';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import { useForm } from '../../forms';
import { percentToProbability } from '../../percent';
import { questionDialog, type QuestionFormProps } from './questionForms';

export const ReferenceDialog = questionDialog(ReferenceForm, (question) => ({ title: 'Add a reference forecast', description: question.title }));

const LABELS = { p: 'Their probability', source: 'Source', at: 'As of' };
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS };

/** What the yes/no reference form held when it saved (questionForms.tsx, `TypedInDialog`). */
export interface ReferenceTyped {
  form: 'reference';
  p: string;
  source: string;
  atLocal: string;
}

function ReferenceForm({ question, onClose, onSaved, restored }: QuestionFormProps<Question>) {
  const mine = restored?.form === 'reference' ? restored : undefined;
  const form = useForm();
  const cancel = useCloseRequest(onClose);
  const listId = useId();
  const [p, setP] = useState(mine?.p ?? '');
  const [source, setSource] = useState(mine?.source ?? '');
  const [atLocal, setAtLocal] = useState(mine?.atLocal ?? '');
  const knownSources = [...new Set(question.references.map((r) => r.source))];
  const dirty = p !== '' || source !== '' || atLocal !== '';

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    const parsed = percentToProbability(p);
    const at = atLocal ? localToIso(atLocal, question.time_zone) : null;
    if (!parsed.ok) found.p = parsed.error;
    else if (parsed.value === null) found.p = 'enter the source’s probability in percent, e.g. 60';
    if (source.trim() === '') found.source = 'name the source, e.g. client’s view';
    if (atLocal && !at) found.at = 'enter a complete date and time, or leave it empty for now';
    const atProblem = at ? typedTimeProblem(at, 'a reference forecast') : null;
    if (atProblem) found.at = atProblem;
    const request = { question_id: question.id, p: parsed.ok && parsed.value !== null ? parsed.value : Number.NaN, source, ...(at ? { at } : {}) };
    if (!form.check(found, { schema: referenceRequest, request, placement: PLACEMENT })) return;
    let undo = '';
    const ok = await form.submit(async () => {
      undo = (await api.addReference(request)).undo;
    }, PLACEMENT);
    if (ok) onSaved(`Added ${source.trim()}’s ${p.trim()}%.`, undo, { form: 'reference', p, source, atLocal });
  }

  return (
    <Form form={form} label="Add a reference forecast" onSubmit={onSubmit} dirty={dirty}>
      <ProbabilityInput label="Their probability" value={p} onChange={setP} required autoFocus error={form.error('p')} />
      <TextField
        label="Source"
        value={source}
        onChange={setSource}
        required
        list={knownSources.length ? listId : undefined}
        placeholder="e.g. client’s view, analyst consensus"
        error={form.error('source')}
      />
      {knownSources.length ? (
        <datalist id={listId}>
          {knownSources.map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
      ) : null}
      <DateTimeField label="As of" local={atLocal} onLocalChange={setAtLocal} timeZone={question.time_zone} hint="Leave empty for now." error={form.error('at')} />
      <FormActions cancel={cancel} busy={form.busy}>
        Add reference
      </FormActions>
    </Form>
  );
}
