/**
 * What the question dialogs share, yes/no and typed alike: their props, saving an edit (only
 * the fields that changed, and no request when none did), and the part of a resolution that
 * does not depend on the type: when it resolved, the note, why a correction, and sending it,
 * asking first where the diary finds the resolution unusual.
 */
import { useState, type ReactNode } from 'react';
import { updateQuestionRequest } from '../../../../shared/contract';
import type { Question } from '../../../../shared/domain';
import { api } from '../../api/client';
import { DateTimeField } from '../../components/DateTimeField';
import { Dialog } from '../../components/Dialog';
import { FormActions } from '../../components/Form';
import { TextArea } from '../../components/TextArea';
import { isoToLocal, localToIso } from '../../dates';
import { sendAskingFirst, useAskFirst } from '../../forgiving/AskFirst';
import { typedTimeProblem } from '../../forgiving/timeChecks';
import type { FieldPlacement, FormState } from '../../forms';
import type { ReferenceTyped } from './ReferenceDialog';
import type { ResolveTyped } from './ResolveDialog';
import type { ReviseTyped } from './ReviseDialog';
import type { TypedEntryTyped } from './TypedEntryDialog';
import type { TypedResolveTyped } from './TypedResolveDialog';

export interface QuestionDialogProps<Q> {
  question: Q;
  open: boolean;
  onClose: () => void;
  /** What was done, the token that undoes it, and what the form held, to give back if it is undone. */
  onSaved: (message: string, undo: string, typed?: TypedInDialog) => void;
  /** What the form held when a save from it was undone: the form starts from it, not from the question. */
  restored?: TypedInDialog | undefined;
}

/**
 * What a revise, reference or resolve form held when it saved, by form. Undoing that save opens the form
 * again with it (typed text is never thrown away); each form takes up only its own kind.
 */
export type TypedInDialog = TypedEntryTyped | TypedResolveTyped | ReviseTyped | ResolveTyped | ReferenceTyped;

/** A resolve form's time, note and why a correction; `atLocal` null when the time was left as shown. */
export interface NotesTyped {
  atLocal: string | null;
  note: string;
  why: string;
}

/** What a dialog's form is given: the dialog's props but whether it is open (it exists only while open). */
export type QuestionFormProps<Q> = Omit<QuestionDialogProps<Q>, 'open'>;

/**
 * A question dialog around its form. The form is mounted as the dialog opens, so it starts
 * from the question as it is then (or from `restored`), and nothing typed survives a close.
 */
export function questionDialog<Q>(QuestionForm: (props: QuestionFormProps<Q>) => ReactNode, frame: (question: Q) => { title: string; description?: string; size?: 'lg' }) {
  return function QuestionDialog({ question, open, onClose, onSaved, restored }: QuestionDialogProps<Q>) {
    return (
      <Dialog open={open} onClose={onClose} {...frame(question)}>
        <QuestionForm question={question} onClose={onClose} onSaved={onSaved} restored={restored} />
      </Dialog>
    );
  };
}

/** The resolve dialog's frame, both types: a resolved question's resolution is corrected. */
export function resolveDialogFrame(question: Question) {
  return { title: question.resolution !== null ? 'Correct the resolution' : 'Resolve the question', description: question.title };
}

export type QuestionChanges = Parameters<typeof api.updateQuestion>[0]['changes'];

/**
 * The fields both edit forms have, as typed: the wording, tags, the base-rate note, the zone
 * and the close; whether any changed; and `read`, which puts the changed ones into a request.
 */
export function useCommonEdits(q: Question) {
  const initialCloses = isoToLocal(q.closes_at, q.time_zone);
  const [title, setTitle] = useState(q.title);
  const [rule, setRule] = useState(q.rule);
  const [tags, setTags] = useState<string[]>(q.tags);
  const [baseRateNote, setBaseRateNote] = useState(q.base_rate_note);
  const [timeZone, setTimeZone] = useState(q.time_zone);
  const [closesLocal, setClosesLocal] = useState(initialCloses);
  const zoneChanged = timeZone !== q.time_zone;

  /** Puts what changed into `changes` and what is wrong into `found`. */
  function read(changes: QuestionChanges, found: Record<string, string>): void {
    if (title !== q.title) changes.title = title;
    if (title.trim() === '') found.title = 'write the question you are forecasting';
    if (rule !== q.rule) changes.rule = rule;
    if (tags.join('\n') !== q.tags.join('\n')) changes.tags = tags;
    if (baseRateNote !== q.base_rate_note) changes.base_rate_note = baseRateNote;
    // A new zone re-reads the times on the new zone's clocks: "17:00" keeps meaning 17:00 there.
    if (zoneChanged) changes.time_zone = timeZone;
    if (zoneChanged || closesLocal !== initialCloses) {
      const iso = localToIso(closesLocal, timeZone);
      if (iso) changes.closes_at = iso;
      else found.closes_at = 'enter when the window closes';
    }
  }

  return {
    fields: { title, setTitle, rule, setRule, tags, setTags, baseRateNote, setBaseRateNote, timeZone, setTimeZone, closesLocal, setClosesLocal },
    zoneChanged,
    dirty: title !== q.title || rule !== q.rule || tags.join('\n') !== q.tags.join('\n') || baseRateNote !== q.base_rate_note || zoneChanged || closesLocal !== initialCloses,
    read,
  };
}

interface SaveEdit {
  form: FormState;
  id: string;
  changes: QuestionChanges;
  /** Problems the form found itself, by field. */
  found: Record<string, string>;
  placement: FieldPlacement;
  onClose: () => void;
  onSaved: (message: string, undo: string) => void;
}

/** Sends an edit once every field checks out; with nothing changed it only closes the dialog. */
export async function saveQuestionChanges({ form, id, changes, found, placement, onClose, onSaved }: SaveEdit): Promise<void> {
  const request = { id, changes };
  if (!form.check(found, { schema: updateQuestionRequest, request, placement })) return;
  if (Object.keys(changes).length === 0) {
    onClose();
    return;
  }
  let undo = '';
  const ok = await form.submit(async () => {
    undo = (await api.updateQuestion(request)).undo;
  }, placement);
  if (ok) onSaved('Question saved.', undo);
}

/** When the question resolved, the note and why a correction, as typed in the resolve dialog (or as `restored` holds them). */
export function useResolutionNotes(question: Question, restored?: NotesTyped) {
  const current = question.resolution;
  const [initialLocal] = useState(() => isoToLocal(current?.at ?? new Date().toISOString(), question.time_zone));
  const [atLocal, setAtLocal] = useState(restored?.atLocal ?? initialLocal);
  const [note, setNote] = useState(restored?.note ?? current?.note ?? '');
  const [why, setWhy] = useState(restored?.why ?? '');

  /**
   * The time to send, with its problems put in `found`. The box shows minutes only. Left as
   * shown, send the exact time instead: the stored resolution's, or none for a new one (the
   * diary stamps it now), so a question opened earlier this minute is not resolved "before it
   * opened".
   */
  function readAt(found: Record<string, string>): string | null {
    const untouched = atLocal === initialLocal;
    const at = untouched ? (current?.at ?? null) : localToIso(atLocal, question.time_zone);
    if (!untouched && !at) found.at = 'enter when it resolved';
    const atProblem = at && !untouched ? typedTimeProblem(at, 'a resolution', question) : null;
    if (atProblem) found.at = atProblem;
    return at;
  }

  return {
    correcting: current !== null,
    atLocal,
    setAtLocal,
    note,
    setNote,
    why,
    setWhy,
    dirty: atLocal !== initialLocal || note !== (current?.note ?? '') || why !== '',
    readAt,
    /** The boxes as typed, to give back if the resolution is undone. */
    typed: (): NotesTyped => ({ atLocal: atLocal === initialLocal ? null : atLocal, note, why }),
    /** What the request carries besides the outcome. */
    extra: (at: string | null) => ({ note, ...(at ? { at } : {}), ...(current && why.trim() ? { correction_note: why } : {}) }),
  };
}

type ResolutionNotes = ReturnType<typeof useResolutionNotes>;

/** The resolve dialog's fields after the outcome, and its actions. */
export function ResolutionNoteFields({ question, notes, form, cancel }: { question: Question; notes: ResolutionNotes; form: FormState; cancel: () => void }) {
  return (
    <>
      <DateTimeField label="Resolved at" local={notes.atLocal} onLocalChange={notes.setAtLocal} timeZone={question.time_zone} required error={form.error('at')} />
      <TextArea label="Note" value={notes.note} onChange={notes.setNote} hint="What happened, and where you can check it." error={form.error('note')} />
      {notes.correcting ? (
        <TextArea
          label="Why the correction"
          value={notes.why}
          onChange={notes.setWhy}
          rows={2}
          hint="Optional. The resolution it replaces is kept in the question’s history with this reason."
          error={form.error('correction_note')}
        />
      ) : null}
      <FormActions cancel={cancel} busy={form.busy}>
        {notes.correcting ? 'Save correction' : 'Resolve'}
      </FormActions>
    </>
  );
}

/**
 * Sends a resolution; where the diary asks first, sends it again only once the user agrees.
 * The undo token, or null when it was not saved (a refusal, or declined at the warning: then
 * nothing changed, and the form stays as typed).
 */
export function useSendResolution(form: FormState, placement: FieldPlacement) {
  const ask = useAskFirst();
  return async (confirmLabel: string, send: (confirm: boolean) => Promise<{ undo: string }>): Promise<string | null> => {
    let undo: string | null = null;
    const ok = await form.submit(async () => {
      const answer = await sendAskingFirst(ask, { confirmLabel }, send);
      undo = answer?.undo ?? null;
    }, placement);
    return ok ? undo : null;
  };
}
