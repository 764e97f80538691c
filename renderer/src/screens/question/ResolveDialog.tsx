/**
 * How the question came out: Yes, No or Void (cannot be resolved fairly; never scored), when,
 * and a note. Also used to correct a resolution already recorded: the one it replaces is
 * kept in the question's history, with the reason given here. A resolution the diary finds
 * unusual (a question about the state at its close, resolved before the close) is sent
 * again only once the user has read why and agreed.
 */
import { useState, type FormEvent } from 'react';
import { resolveRequest } from '../../../../shared/contract';
import type { Outcome, BinaryQuestion } from '../../../../shared/domain';
import { api } from '../../api/client';
import { Button } from '../../components/Button';
import { ChoiceGroup } from '../../components/ChoiceGroup';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog, useCloseRequest } from '../../components/Dialog';
import { Form } from '../../components/Form';
import { OUTCOME_HINTS, OutcomeIcon } from '../../components/OutcomeMark';
import { OUTCOME_LABELS } from '../../components/StatusPill';
import { TextArea } from '../../components/TextArea';
import { isoToLocal, localToIso } from '../../dates';
import { sendAskingFirst, useAskFirst } from '../../forgiving/AskFirst';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import { useForm } from '../../forms';

interface Props {
  question: BinaryQuestion;
  open: boolean;
  onClose: () => void;
  /** What was done, and the token that undoes it. */
  onSaved: (message: string, undo: string) => void;
}

const OUTCOME_CHOICES = (['yes', 'no', 'void'] as const).map((outcome) => ({
  value: outcome,
  label: outcome === 'void' ? 'Void — cannot be resolved fairly' : OUTCOME_LABELS[outcome],
  icon: <OutcomeIcon outcome={outcome} />,
  tone: outcome,
}));

const LABELS = { outcome: 'Outcome', at: 'Resolved at', note: 'Note', correction_note: 'Why the correction' };
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS };

export function ResolveDialog({ question, open, onClose, onSaved }: Props) {
  const correcting = question.resolution !== null;
  return (
    <Dialog open={open} onClose={onClose} title={correcting ? 'Correct the resolution' : 'Resolve the question'} description={question.title}>
      <ResolveForm question={question} onClose={onClose} onSaved={onSaved} />
    </Dialog>
  );
}

function ResolveForm({ question, onClose, onSaved }: Omit<Props, 'open'>) {
  const form = useForm();
  const ask = useAskFirst();
  const cancel = useCloseRequest(onClose);
  const current = question.resolution;
  const [outcome, setOutcome] = useState<Outcome | ''>(current?.outcome ?? '');
  const [initialLocal] = useState(() => isoToLocal(current?.at ?? new Date().toISOString(), question.time_zone));
  const [atLocal, setAtLocal] = useState(initialLocal);
  const [note, setNote] = useState(current?.note ?? '');
  const [why, setWhy] = useState('');
  const dirty = outcome !== (current?.outcome ?? '') || atLocal !== initialLocal || note !== (current?.note ?? '') || why !== '';

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    // The box shows minutes only. Left as shown, send the exact time instead: the stored
    // resolution's, or none for a new one (the diary stamps it now), so a question opened
    // earlier this minute is not resolved "before it opened".
    const untouched = atLocal === initialLocal;
    const at = untouched ? (current?.at ?? null) : localToIso(atLocal, question.time_zone);
    const found: Record<string, string> = {};
    if (outcome === '') found.outcome = 'choose Yes, No or Void';
    if (!untouched && !at) found.at = 'enter when it resolved';
    const atProblem = at && !untouched ? typedTimeProblem(at, 'a resolution', question) : null;
    if (atProblem) found.at = atProblem;
    const request = { id: question.id, outcome, note, ...(at ? { at } : {}), ...(current && why.trim() ? { correction_note: why } : {}) };
    if (!form.check(found, { schema: resolveRequest, request, placement: PLACEMENT }) || outcome === '') return;
    const chosen = outcome;
    let undo: string | null = null;
    const ok = await form.submit(async () => {
      const answer = await sendAskingFirst(ask, { confirmLabel: `Resolve ${OUTCOME_LABELS[chosen]} anyway` }, (confirm) =>
        api.resolveQuestion({ ...request, outcome: chosen, ...(confirm ? { confirm } : {}) }),
      );
      undo = answer?.undo ?? null;
    }, PLACEMENT);
    // Declined at the warning: nothing changed, and the form stays as typed.
    if (ok && undo !== null) onSaved(current ? `Resolution corrected to ${OUTCOME_LABELS[chosen]}.` : `Resolved ${OUTCOME_LABELS[chosen]}.`, undo);
  }

  return (
    <Form form={form} label="Resolution" onSubmit={onSubmit} dirty={dirty}>
      <ChoiceGroup legend="Outcome" value={outcome} choices={OUTCOME_CHOICES} onChange={(v) => setOutcome(v as Outcome)} error={form.error('outcome')} />
      {outcome !== '' ? <p className="field__hint">{OUTCOME_HINTS[outcome]}.</p> : null}
      <DateTimeField label="Resolved at" local={atLocal} onLocalChange={setAtLocal} timeZone={question.time_zone} required error={form.error('at')} />
      <TextArea label="Note" value={note} onChange={setNote} hint="What happened, and where you can check it." error={form.error('note')} />
      {current ? (
        <TextArea
          label="Why the correction"
          value={why}
          onChange={setWhy}
          rows={2}
          hint="Optional. The resolution it replaces is kept in the question’s history with this reason."
          error={form.error('correction_note')}
        />
      ) : null}
      <div className="form__actions">
        <Button onClick={cancel}>Cancel</Button>
        <Button type="submit" variant="primary" busy={form.busy}>
          {current ? 'Save correction' : 'Resolve'}
        </Button>
      </div>
    </Form>
  );
}
