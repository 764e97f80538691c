/**
 * How the question came out: Yes, No or Void (cannot be resolved fairly; never scored), when,
 * and a note. Also used to correct a resolution already recorded.
 */
import { useState, type FormEvent } from 'react';
import type { Outcome, Question } from '../../../../shared/domain';
import { api } from '../../api/client';
import { Button } from '../../components/Button';
import { ChoiceGroup } from '../../components/ChoiceGroup';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog } from '../../components/Dialog';
import { ErrorBanner } from '../../components/ErrorBanner';
import { OUTCOME_LABELS } from '../../components/StatusPill';
import { TextArea } from '../../components/TextArea';
import { isoToLocal, localToIso } from '../../dates';
import { useForm } from '../../forms';

interface Props {
  question: Question;
  open: boolean;
  onClose: () => void;
  onSaved: (message: string) => void;
}

const OUTCOME_CHOICES = [
  { value: 'yes', label: 'Yes' },
  { value: 'no', label: 'No' },
  { value: 'void', label: 'Void — cannot be resolved fairly' },
];

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
  const current = question.resolution;
  const [outcome, setOutcome] = useState<Outcome | ''>(current?.outcome ?? '');
  const [initialLocal] = useState(() => isoToLocal(current?.at ?? new Date().toISOString(), question.time_zone));
  const [atLocal, setAtLocal] = useState(initialLocal);
  const [note, setNote] = useState(current?.note ?? '');

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
    if (outcome === '' || (!untouched && !at)) return void form.reject(found);
    const chosen = outcome;
    const ok = await form.submit(
      async () => {
        await api.resolveQuestion({ id: question.id, outcome: chosen, note, ...(at ? { at } : {}) });
      },
      { fields: ['outcome', 'at', 'note'] },
    );
    if (ok) onSaved(current ? `Resolution corrected to ${OUTCOME_LABELS[chosen]}.` : `Resolved ${OUTCOME_LABELS[chosen]}.`);
  }

  return (
    <form ref={form.formRef} className="form" noValidate onSubmit={onSubmit} aria-label="Resolution">
      {form.banner ? <ErrorBanner message={form.banner.message} details={form.banner.details} /> : null}
      <ChoiceGroup legend="Outcome" value={outcome} choices={OUTCOME_CHOICES} onChange={(v) => setOutcome(v as Outcome)} error={form.error('outcome')} />
      <DateTimeField label="Resolved at" local={atLocal} onLocalChange={setAtLocal} timeZone={question.time_zone} required error={form.error('at')} />
      <TextArea label="Note" value={note} onChange={setNote} hint="What happened, and where you can check it." error={form.error('note')} />
      <div className="form__actions">
        <Button onClick={onClose}>Cancel</Button>
        <Button type="submit" variant="primary" busy={form.busy}>
          {current ? 'Save correction' : 'Resolve'}
        </Button>
      </div>
    </form>
  );
}
