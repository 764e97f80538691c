/** A probability from a named outside source (a client's view, a consensus figure). */
import { useId, useState, type FormEvent } from 'react';
import type { Question } from '../../../../shared/domain';
import { api } from '../../api/client';
import { Button } from '../../components/Button';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog } from '../../components/Dialog';
import { ErrorBanner } from '../../components/ErrorBanner';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { TextField } from '../../components/TextField';
import { localToIso } from '../../dates';
import { useForm } from '../../forms';
import { percentToProbability } from '../../percent';

interface Props {
  question: Question;
  open: boolean;
  onClose: () => void;
  onSaved: (message: string) => void;
}

export function ReferenceDialog({ question, open, onClose, onSaved }: Props) {
  return (
    <Dialog open={open} onClose={onClose} title="Add a reference forecast" description={question.title}>
      <ReferenceForm question={question} onClose={onClose} onSaved={onSaved} />
    </Dialog>
  );
}

function ReferenceForm({ question, onClose, onSaved }: Omit<Props, 'open'>) {
  const form = useForm();
  const listId = useId();
  const [p, setP] = useState('');
  const [source, setSource] = useState('');
  const [atLocal, setAtLocal] = useState('');
  const knownSources = [...new Set(question.references.map((r) => r.source))];

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const parsed = percentToProbability(p);
    const at = atLocal ? localToIso(atLocal, question.time_zone) : null;
    if (!parsed.ok) return void form.reject({ p: parsed.error });
    if (parsed.value === null) return void form.reject({ p: 'enter the source’s probability in percent, e.g. 60' });
    if (atLocal && !at) return void form.reject({ at: 'enter a complete date and time, or leave it empty for now' });
    const value = parsed.value;
    const ok = await form.submit(
      async () => {
        await api.addReference({ question_id: question.id, p: value, source, ...(at ? { at } : {}) });
      },
      { fields: ['p', 'source', 'at'] },
    );
    if (ok) onSaved(`Added ${source.trim()}’s ${p.trim()}%.`);
  }

  return (
    <form ref={form.formRef} className="form" noValidate onSubmit={onSubmit} aria-label="Add a reference forecast">
      {form.banner ? <ErrorBanner message={form.banner.message} details={form.banner.details} /> : null}
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
      <div className="form__actions">
        <Button onClick={onClose}>Cancel</Button>
        <Button type="submit" variant="primary" busy={form.busy}>
          Add reference
        </Button>
      </div>
    </form>
  );
}
