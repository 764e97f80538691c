/**
 * One question on the Desk: why it is due, the last number, and the one-click answers —
 * an outcome for a closed question, a revision for an open one, a snooze for either.
 * Panels (note, revision, snooze choices) open in place; Escape closes them. Every answer
 * hands its undo token(s) to the Desk, whose toast offers Undo.
 */
import { useEffect, useId, useRef, useState, type FormEvent, type KeyboardEvent } from 'react';
import type { Outcome } from '../../../../shared/domain';
import { extent } from '../../../../shared/extent';
import { api } from '../../api/client';
import { describeError } from '../../api/errors';
import { Badge } from '../../components/Badge';
import { Button } from '../../components/Button';
import { Form } from '../../components/Form';
import { OutcomeButton } from '../../components/OutcomeMark';
import { ProbabilityInput } from '../../components/ProbabilityInput';
import { OUTCOME_LABELS } from '../../components/StatusPill';
import { TextArea } from '../../components/TextArea';
import { TextField } from '../../components/TextField';
import { useForm } from '../../forms';
import type { TypedQuestion } from '../question/TypedEntryDialog';
import type { TypedInDialog } from '../question/questionForms';
import { formatPercent, percentText, percentToProbability } from '../../percent';
import { sendAskingFirst, useAskFirst } from '../../forgiving/AskFirst';
import { hrefTo, questionPath } from '../../routing';
import { dueKinds, type DeskItem } from './items';
import { TypedDeskActions, typedLast, useTypedQuestion } from './TypedDeskActions';
import { ago, checkinPhrase, closedPhrase, closingPhrase, dayWord, clockTime, overduePhrase } from './wording';

const STALE_EXPLANATION = 'well above its glide path and not revised for longer than its check-in cadence';

/** What an action did, for the toast, and the tokens that undo it (in the order its steps were made). */
export interface Done {
  message: string;
  undo: string[];
}

interface Props {
  item: DeskItem;
  /** The instant the due list was computed for (epoch ms). */
  now: number;
  /** The diary's zone: snoozes run out on its mornings. */
  diaryTimeZone: string;
  /** `typed`: what the card held when it acted, to give back if the action is undone. */
  onDone: (item: DeskItem, done: Done, typed: TypedOnCard) => void;
  onFailed: (message: string) => void;
  /** What the card held when an action it took was undone: it opens with it again. */
  restored?: TypedOnCard | undefined;
  /** Told once the card has taken `restored` up. */
  onRestored?: (id: string) => void;
}

type Panel = 'none' | 'note' | 'revise' | 'snooze';

/**
 * A yes/no card's typed text: the resolution note and the revision's number and note, and
 * the panel they were in. Undoing a resolution or a revision made from the card brings the
 * question back with them, not with empty boxes (typed text is never thrown away). A choice
 * or numeric card keeps what its dialog held instead, and opens that dialog again with it.
 */
export interface TypedOnCard {
  note: string;
  revision: RevisionDraft;
  panel: 'none' | 'note' | 'revise';
  dialog?: TypedInDialog;
}

export function DeskItemCard({ item, now, diaryTimeZone, onDone, onFailed, restored, onRestored }: Props) {
  const titleId = useId();
  const [panel, setPanel] = useState<Panel>(restored?.panel ?? 'none');
  const [busy, setBusy] = useState(false);
  const [note, setNote] = useState(restored?.note ?? '');
  // What was typed in the revise panel outlives the panel (Escape, Cancel), like the note does.
  const [revision, setRevision] = useState<RevisionDraft>(() => restored?.revision ?? { p: percentText(item.last_p), note: '' });
  useEffect(() => {
    if (restored) onRestored?.(item.id);
  }, [restored, onRestored, item.id]);
  const href = hrefTo(questionPath(item.id));
  const toResolve = item.group === 'resolve';
  const typed = useTypedQuestion(item);

  // After an action the item stays disabled until the Desk's next answer replaces it (it
  // leaves, moves, or stays with new facts), so a second click cannot repeat the action.
  useEffect(() => setBusy(false), [item]);

  function finish(done: Done, dialog?: TypedInDialog) {
    setBusy(true);
    setPanel('none');
    onDone(item, done, { note, revision, panel: panel === 'snooze' ? 'none' : panel, ...(dialog ? { dialog } : {}) });
  }

  /** Runs an answer; null from it means the user stopped at a warning, and nothing changed. */
  async function run(action: () => Promise<Done | null>): Promise<void> {
    setBusy(true);
    let done: Done | null;
    try {
      done = await action();
    } catch (error) {
      setBusy(false);
      onFailed(describeError(error));
      return;
    }
    if (done) finish(done);
    else setBusy(false);
  }

  /** Escape closes an open panel and gives focus back to the button that opened it. */
  function closePanelOnEscape(event: KeyboardEvent<HTMLLIElement>) {
    if (event.key !== 'Escape' || panel === 'none') return;
    event.stopPropagation();
    event.currentTarget.querySelector<HTMLElement>('[aria-expanded="true"]')?.focus();
    setPanel('none');
  }

  return (
    <li className="desk-item" data-testid="desk-item" data-desk-item={item.id} data-group={item.group} aria-labelledby={titleId} onKeyDown={closePanelOnEscape}>
      <div className="desk-item__head">
        <h3 className="desk-item__title" id={titleId}>
          <a href={href}>{item.title}</a>
        </h3>
        <Facts item={item} typed={typed} now={now} />
      </div>
      <div className="desk-item__actions">
        {item.type !== 'binary' ? (
          <TypedDeskActions item={item} q={typed} toResolve={toResolve} disabled={busy} onDone={finish} restored={restored?.dialog} />
        ) : toResolve ? (
          <ResolveButtons
            item={item}
            note={note}
            busy={busy}
            noteOpen={panel === 'note'}
            noteId={`${titleId}-note`}
            onToggleNote={() => setPanel(panel === 'note' ? 'none' : 'note')}
            run={run}
          />
        ) : (
          <DisclosureButton label="Revise" open={panel === 'revise'} variant="primary" disabled={busy} onToggle={() => setPanel(panel === 'revise' ? 'none' : 'revise')} controls={`${titleId}-revise`} />
        )}
        <DisclosureButton label="Snooze" open={panel === 'snooze'} disabled={busy} onToggle={() => setPanel(panel === 'snooze' ? 'none' : 'snooze')} controls={`${titleId}-snooze`} />
      </div>
      {panel === 'note' ? (
        <div id={`${titleId}-note`} className="desk-item__panel">
          <NoteField note={note} onChange={setNote} />
        </div>
      ) : null}
      {panel === 'revise' ? (
        <div id={`${titleId}-revise`} className="desk-item__panel">
          <ReviseForm item={item} draft={revision} onDraftChange={setRevision} onCancel={() => setPanel('none')} onSaved={finish} />
        </div>
      ) : null}
      {panel === 'snooze' ? (
        <div id={`${titleId}-snooze`} className="desk-item__panel">
          <SnoozeChoices item={item} diaryTimeZone={diaryTimeZone} busy={busy} run={run} />
        </div>
      ) : null}
    </li>
  );
}

/** Why it is due, the last forecast and how old it is (any type of question), and the stale flag. */
function Facts({ item, typed, now }: { item: DeskItem; typed: TypedQuestion | undefined; now: number }) {
  const close = Date.parse(item.closes_at);
  const zone = item.time_zone;
  const lines: string[] = [];
  if (item.due.overdue || item.due.window_closed) lines.push(closedPhrase(close, now, zone));
  if (item.due.closing_soon) lines.push(closingPhrase(close, now, zone));
  if (item.due.checkin) lines.push(checkinPhrase(Date.parse(item.due.checkin), now, zone));
  return (
    <div className="desk-item__facts">
      {item.due.overdue ? (
        <Badge tone="danger">{overduePhrase(Date.parse(item.due.overdue), now)}</Badge>
      ) : null}
      {lines.map((line, i) => (
        <p key={i} className="desk-item__why">
          {line}
        </p>
      ))}
      {item.type === 'binary' ? (
        <LastForecast text={item.last_p === null ? null : formatPercent(item.last_p)} at={item.last_forecast_at} now={now} zone={zone} />
      ) : typed === undefined ? (
        <p className="desk-item__last" data-testid="desk-typed-last">
          …
        </p>
      ) : (
        <LastForecast {...(typedLast(typed) ?? { text: null, at: null })} now={now} zone={zone} testId="desk-typed-last" />
      )}
      {item.stale ? (
        <p className="desk-item__stale">
          <Badge tone="amber">Stale</Badge> <span>Its forecast is {STALE_EXPLANATION}.</span>
        </p>
      ) : null}
    </div>
  );
}

/** "Last forecast 45%, 27 days ago": the same line for a percent, an option or a range. */
function LastForecast({ text, at, now, zone, testId }: { text: string | null; at: string | null; now: number; zone: string; testId?: string }) {
  const when = at ? Date.parse(at) : null;
  return (
    <p className="desk-item__last" data-testid={testId}>
      {text === null || when === null ? (
        'No forecast yet'
      ) : (
        <>
          Last forecast <strong className="desk-item__p">{text}</strong>,{' '}
          <time dateTime={at ?? undefined} title={`${dayWord(when, now, zone)} ${clockTime(when, zone)}`}>
            {ago(when, now)}
          </time>
        </>
      )}
    </p>
  );
}

function DisclosureButton({
  label,
  open,
  onToggle,
  controls,
  disabled,
  variant = 'secondary',
}: {
  label: string;
  open: boolean;
  onToggle: () => void;
  controls: string;
  disabled: boolean;
  variant?: 'primary' | 'secondary';
}) {
  return (
    <Button size="sm" variant={open ? 'secondary' : variant} aria-expanded={open} aria-controls={open ? controls : undefined} disabled={disabled} onClick={onToggle}>
      {label}
      <span className={`desk-item__chevron ${open ? 'desk-item__chevron--open' : ''}`} aria-hidden="true" />
    </Button>
  );
}

function ResolveButtons({
  item,
  note,
  busy,
  noteOpen,
  noteId,
  onToggleNote,
  run,
}: {
  item: DeskItem;
  note: string;
  busy: boolean;
  noteOpen: boolean;
  noteId: string;
  onToggleNote: () => void;
  run: (action: () => Promise<Done | null>) => Promise<void>;
}) {
  const groupId = useId();
  const ask = useAskFirst();

  function resolve(outcome: Outcome) {
    void run(async () => {
      const request = { id: item.id, outcome, ...(note.trim() ? { note: note.trim() } : {}) };
      const answer = await sendAskingFirst(ask, { confirmLabel: `Resolve ${OUTCOME_LABELS[outcome]} anyway` }, (confirm) =>
        api.resolveQuestion({ ...request, ...(confirm ? { confirm } : {}) }),
      );
      if (!answer) return null;
      return { message: `Resolved “${item.title}”: ${OUTCOME_LABELS[outcome]}${note.trim() ? ', with your note' : ''}.`, undo: [answer.undo] };
    });
  }

  return (
    <>
      <div className="desk-item__outcomes" role="group" aria-labelledby={`${groupId}-label`}>
        <span className="desk-item__label" id={`${groupId}-label`}>
          Resolve
        </span>
        {(['yes', 'no', 'void'] as const).map((outcome) => (
          <OutcomeButton key={outcome} outcome={outcome} label={OUTCOME_LABELS[outcome]} disabled={busy} onClick={() => resolve(outcome)} />
        ))}
      </div>
      <Button size="sm" variant="ghost" aria-expanded={noteOpen} aria-controls={noteOpen ? noteId : undefined} disabled={busy} onClick={onToggleNote}>
        {noteOpen ? 'Hide note' : note.trim() ? 'Edit note' : 'Add a note'}
      </Button>
    </>
  );
}

/** The note saved with whichever outcome is clicked; it keeps its text while hidden. */
function NoteField({ note, onChange }: { note: string; onChange: (note: string) => void }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    ref.current?.querySelector('textarea')?.focus();
  }, []);
  return (
    <div ref={ref}>
      <TextArea label="Resolution note" value={note} onChange={onChange} rows={2} hint="Saved with the outcome you click next: what happened, and where you can check it." />
    </div>
  );
}

export interface RevisionDraft {
  p: string;
  note: string;
}

function ReviseForm({
  item,
  draft,
  onDraftChange,
  onCancel,
  onSaved,
}: {
  item: DeskItem;
  draft: RevisionDraft;
  onDraftChange: (draft: RevisionDraft) => void;
  onCancel: () => void;
  onSaved: (done: Done) => void;
}) {
  const form = useForm();
  const { p, note } = draft;
  const setP = (value: string) => onDraftChange({ ...draft, p: value });
  const setNote = (value: string) => onDraftChange({ ...draft, note: value });

  // The box opens on the last number, selected: typing a new one replaces it (not 45 → 4530).
  useEffect(() => {
    const box = form.formRef.current?.querySelector<HTMLInputElement>('input[type="number"]');
    box?.focus();
    box?.select();
  }, [form.formRef]);

  async function onSubmit(event: FormEvent) {
    event.preventDefault();
    const parsed = percentToProbability(p);
    if (!parsed.ok) return void form.reject({ p: parsed.error });
    if (parsed.value === null) return void form.reject({ p: 'enter your probability in percent, e.g. 35' });
    if (!form.check({})) return;
    const value = parsed.value;
    const unchanged = item.last_p !== null && value === item.last_p;
    let undo = '';
    const ok = await form.submit(
      async () => {
        undo = (await api.addForecast({ question_id: item.id, p: value, ...(note.trim() ? { note: note.trim() } : {}) })).undo;
      },
      { fields: ['p', 'note'] },
    );
    if (!ok) return;
    onDraftChange({ p, note: '' });
    onSaved({
      message: unchanged ? `Kept “${item.title}” at ${formatPercent(value)}; check-in done.` : `Revised “${item.title}” to ${formatPercent(value)}.`,
      undo: [undo],
    });
  }

  return (
    <Form form={form} label={`Revise “${item.title}”`} className="desk-revise" onSubmit={onSubmit} dirty={false}>
      <ProbabilityInput label="New probability" value={p} onChange={setP} required error={form.error('p')} hint={item.last_p === null ? undefined : `Was ${formatPercent(item.last_p)}; saving the same number confirms it.`} />
      <TextField label="What changed" value={note} onChange={setNote} placeholder="Optional: the evidence behind the number" error={form.error('note')} />
      <div className="desk-revise__actions">
        <Button onClick={onCancel}>Cancel</Button>
        <Button type="submit" variant="primary" busy={form.busy}>
          Save revision
        </Button>
      </div>
    </Form>
  );
}

const SNOOZE_CHOICES = [
  { preset: 'hour', label: 'In 1 hour' },
  { preset: 'tomorrow_morning', label: 'Tomorrow morning' },
  { preset: 'next_week', label: 'Next week' },
] as const;

function SnoozeChoices({
  item,
  diaryTimeZone,
  busy,
  run,
}: {
  item: DeskItem;
  diaryTimeZone: string;
  busy: boolean;
  run: (action: () => Promise<Done | null>) => Promise<void>;
}) {
  const groupId = useId();
  const ref = useRef<HTMLDivElement>(null);

  useEffect(() => {
    ref.current?.querySelector('button')?.focus();
  }, []);

  function snooze(preset: (typeof SNOOZE_CHOICES)[number]['preset']) {
    void run(async () => {
      // Every kind due for the question, so the whole item leaves the Desk until then; one
      // after another, so their undo tokens are known in order (Undo takes them back newest first).
      const answers = [];
      for (const kind of dueKinds(item)) answers.push(await api.snooze({ question_id: item.id, kind, preset }));
      const until = extent(answers.map((a) => Date.parse(a.until))).max;
      const when = `${dayWord(until, Date.now(), diaryTimeZone)} ${clockTime(until, diaryTimeZone)}`;
      return { message: `Snoozed “${item.title}” until ${when}.`, undo: answers.map((a) => a.undo) };
    });
  }

  return (
    <div ref={ref} className="desk-snooze" role="group" aria-labelledby={`${groupId}-label`}>
      <span className="desk-item__label" id={`${groupId}-label`}>
        Snooze until
      </span>
      {SNOOZE_CHOICES.map((choice) => (
        <Button key={choice.preset} size="sm" disabled={busy} onClick={() => snooze(choice.preset)}>
          {choice.label}
        </Button>
      ))}
    </div>
  );
}
