/**
 * Tags typed one at a time: Enter or comma adds the tag, Backspace in an empty box removes the
 * last one; a list pasted with commas adds each tag in it. Tags are lower-cased and checked against the diary's tag rule before they are added,
 * so the user learns about a bad tag while typing rather than on save; a bad tag left in the
 * box stops the form from saving (it would otherwise be dropped without a word).
 */
import { useId, useState, type KeyboardEvent } from 'react';
import { TAG_PATTERN, TAG_RULE } from '../../../shared/validation';
import { useFieldProblem } from '../forms';
import { FieldFrame, describedBy } from './FieldFrame';

/** The draft's pieces as typed: a pasted list ("client:quellmoor, renewals") holds several. */
function piecesOf(draft: string): string[] {
  return draft
    .split(',')
    .map((piece) => piece.trim())
    .filter((piece) => piece !== '');
}

const isTag = (piece: string): boolean => TAG_PATTERN.test(piece.toLowerCase());

function tagProblem(pieces: readonly string[]): string | null {
  const bad = pieces.find((piece) => !isTag(piece));
  return bad === undefined ? null : `“${bad.toLowerCase()}” is not a valid tag: ${TAG_RULE}. Fix it or clear the box.`;
}

export interface TagInputProps {
  label: string;
  tags: readonly string[];
  onChange: (tags: string[]) => void;
  /** Tags already in the diary, offered as completions. */
  suggestions?: readonly string[] | undefined;
  hint?: string | undefined;
  error?: string | undefined;
  id?: string | undefined;
}

export function TagInput({ label, tags, onChange, suggestions = [], hint, error, id }: TagInputProps) {
  const generated = useId();
  const controlId = id ?? generated;
  const listId = `${controlId}-suggestions`;
  const [draft, setDraft] = useState('');
  const [draftError, setDraftError] = useState<string | undefined>();
  useFieldProblem(tagProblem(piecesOf(draft)));

  /** Adds the draft's valid tags; any that are not stay in the box as typed, with the reason, so nothing typed is dropped. */
  function commit() {
    const pieces = piecesOf(draft);
    const added = [...new Set(pieces.filter(isTag).map((piece) => piece.toLowerCase()))].filter((tag) => !tags.includes(tag));
    if (added.length) onChange([...tags, ...added]);
    const left = pieces.filter((piece) => !isTag(piece));
    setDraft(left.join(', '));
    setDraftError(tagProblem(left) ?? undefined);
  }

  function onKeyDown(event: KeyboardEvent<HTMLInputElement>) {
    if (event.key === 'Enter' || event.key === ',') {
      // With an empty box, Enter keeps its usual meaning (submit the form).
      if (draft.trim() === '' && event.key === 'Enter') return;
      event.preventDefault();
      commit();
    } else if (event.key === 'Backspace' && draft === '' && tags.length > 0) {
      onChange(tags.slice(0, -1));
    }
  }

  const shownError = draftError ?? error;
  const shownHint = hint ?? 'Press Enter or comma after each tag.';
  const available = suggestions.filter((s) => !tags.includes(s));
  return (
    <FieldFrame controlId={controlId} label={label} hint={shownHint} error={shownError} className="tags">
      <div className="tags__box">
        {tags.length > 0 ? (
          <ul className="tags__list" aria-label={`${label}: chosen`}>
            {tags.map((tag) => (
              <li key={tag} className="tag-chip">
                <span>{tag}</span>
                <button
                  type="button"
                  className="tag-chip__remove"
                  aria-label={`Remove tag ${tag}`}
                  onClick={() => onChange(tags.filter((t) => t !== tag))}
                >
                  ×
                </button>
              </li>
            ))}
          </ul>
        ) : null}
        <input
          id={controlId}
          className="tags__input"
          value={draft}
          list={available.length ? listId : undefined}
          autoComplete="off"
          autoCapitalize="none"
          spellCheck={false}
          aria-invalid={shownError ? true : undefined}
          aria-describedby={describedBy(controlId, shownHint, shownError)}
          onChange={(event) => {
            setDraft(event.target.value);
            if (draftError) setDraftError(undefined);
          }}
          onKeyDown={onKeyDown}
          onBlur={commit}
        />
        {available.length ? (
          <datalist id={listId}>
            {available.map((s) => (
              <option key={s} value={s} />
            ))}
          </datalist>
        ) : null}
      </div>
    </FieldFrame>
  );
}
