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
import { ChoiceGroup } from '../../components/ChoiceGroup';
import { useCloseRequest } from '../../components/Dialog';
import { Form } from '../../components/Form';
import { OUTCOME_HINTS, OutcomeIcon } from '../../components/OutcomeMark';
import { OUTCOME_LABELS } from '../../components/StatusPill';
import { useForm } from '../../forms';
import { type NotesTyped, questionDialog, type QuestionFormProps, ResolutionNoteFields, resolveDialogFrame, useResolutionNotes, useSendResolution } from './questionForms';

const OUTCOME_CHOICES = (['yes', 'no', 'void'] as const).map((outcome) => ({
  value: outcome,
  label: outcome === 'void' ? 'Void — cannot be resolved fairly' : OUTCOME_LABELS[outcome],
  icon: <OutcomeIcon outcome={outcome} />,
  tone: outcome,
}));

const LABELS = { outcome: 'Outcome', at: 'Resolved at', note: 'Note', correction_note: 'Why the correction' };
const PLACEMENT = { fields: Object.keys(LABELS), labels: LABELS };

export const ResolveDialog = questionDialog(ResolveForm, resolveDialogFrame);

/** What the yes/no resolve form held when it saved (questionForms.tsx, `TypedInDialog`). */
export interface ResolveTyped {
  form: 'resolve';
  outcome: Outcome | '';
  notes: NotesTyped;
}

function ResolveForm({ question, onClose, onSaved, restored }: QuestionFormProps<BinaryQuestion>) {
  const form = useForm();
  const send = useSendResolution(form, PLACEMENT);
  const cancel = useCloseRequest(onClose);
  const current = question.resolution;
  const mine = restored?.form === 'resolve' ? restored : undefined;
  const notes = useResolutionNotes(question, mine?.notes);
  const [outcome, setOutcome] = useState<Outcome | ''>(mine?.outcome ?? current?.outcome ?? '');
  const dirty = outcome !== (current?.outcome ?? '') || notes.dirty;

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    if (outcome === '') found.outcome = 'choose Yes, No or Void';
    const at = notes.readAt(found);
    const request = { id: question.id, outcome, ...notes.extra(at) };
    if (!form.check(found, { schema: resolveRequest, request, placement: PLACEMENT }) || outcome === '') return;
    const chosen = outcome;
    const undo = await send(`Resolve ${OUTCOME_LABELS[chosen]} anyway`, (confirm) => api.resolveQuestion({ ...request, outcome: chosen, ...(confirm ? { confirm } : {}) }));
    if (undo !== null)
      onSaved(current ? `Resolution corrected to ${OUTCOME_LABELS[chosen]}.` : `Resolved ${OUTCOME_LABELS[chosen]}.`, undo, { form: 'resolve', outcome, notes: notes.typed() });
  }

  return (
    <Form form={form} label="Resolution" onSubmit={onSubmit} dirty={dirty}>
      <ChoiceGroup legend="Outcome" value={outcome} choices={OUTCOME_CHOICES} onChange={(v) => setOutcome(v as Outcome)} error={form.error('outcome')} />
      {outcome !== '' ? <p className="field__hint">{OUTCOME_HINTS[outcome]}.</p> : null}
      <ResolutionNoteFields question={question} notes={notes} form={form} cancel={cancel} />
    </Form>
  );
}
