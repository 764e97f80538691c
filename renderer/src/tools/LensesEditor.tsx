/**
 * Lenses on the revise form: any number of named perspective estimates (outside view,
 * inside view, devil's advocate, …) with weights, and a live pooled suggestion by weighted
 * log-odds averaging with an adjustable extremizing factor. "Use suggestion" copies the
 * suggestion into the user's own number; the user's number stays the forecast.
 */
import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import { Button } from '../components/Button';
import { FieldError } from '../components/FieldError';
import { commaAsPoint, pastedPercentText } from '../components/decimalComma';
import { FieldFrame, describedBy } from '../components/FieldFrame';
import { PercentAdvice, hasPercentAdvice } from '../components/PercentAdvice';
import { UNREADABLE_NUMBER, useUnreadableNumber } from '../components/unreadableNumber';
import { percentAdvice } from '../percent';
import { estimateText, formatEstimate, numberOrNull } from './format';
import {
  EXTREMIZE_MAX,
  EXTREMIZE_MIN,
  MAX_LENSES,
  SUGGESTED_LENS_NAMES,
  lensField,
  newLens,
  pooledSuggestion,
  type LensDraft,
} from './lenses';
import './tools.css';

export interface LensesEditorProps {
  lenses: readonly LensDraft[];
  onLensesChange: (next: LensDraft[]) => void;
  /** The extremizing factor as typed (1–3). */
  extremize: string;
  onExtremizeChange: (text: string) => void;
  /** Puts the suggestion (percent text) into the user's own probability box. */
  onUseSuggestion: (percentText: string) => void;
  /** The form's message for a field key (see `lensField`). */
  error: (field: string) => string | undefined;
}

/** Enter in a lens box must not save the revision half-way through filling the lenses. */
function keepEnter(event: KeyboardEvent<HTMLElement>) {
  if (event.key === 'Enter' && event.target instanceof HTMLInputElement) event.preventDefault();
}

/** "the one lens", "both lenses", "all 3 lenses", "2 of 3 lenses". */
function whichLenses(used: number, total: number): string {
  if (used < total) return `${used} of ${total} lenses`;
  if (total === 1) return 'the one lens';
  return total === 2 ? 'both lenses' : `all ${total} lenses`;
}

export function LensesEditor({ lenses, onLensesChange, extremize, onExtremizeChange, onUseSuggestion, error }: LensesEditorProps) {
  const listId = useId();
  const extremizeId = useId();
  const listRef = useRef<HTMLOListElement>(null);
  const addRef = useRef<HTMLButtonElement>(null);
  const [focusKey, setFocusKey] = useState<number | 'add' | null>(null);
  // Open whenever a row needs an answer, so nothing the form waits for is folded away.
  const hasErrors = lenses.some(
    (l) => error(lensField(l.key, 'name')) || error(lensField(l.key, 'p')) || error(lensField(l.key, 'weight')) || percentAdvice(l.p)?.kind === 'fraction',
  );
  const [open, setOpen] = useState(false);

  // After adding a row, the keyboard goes to its probability (the name is already offered);
  // after removing one, to "Add lens", so focus never falls back to the top of the dialog.
  useEffect(() => {
    if (focusKey === null) return;
    if (focusKey === 'add') addRef.current?.focus();
    else listRef.current?.querySelector<HTMLInputElement>(`[data-lens="${focusKey}"]`)?.focus();
    setFocusKey(null);
  }, [focusKey]);

  const a = numberOrNull(extremize);
  const pooled = pooledSuggestion(lenses, a);
  const sliderValue = a === null ? EXTREMIZE_MIN : Math.min(EXTREMIZE_MAX, Math.max(EXTREMIZE_MIN, a));
  const extremizeUnreadable = useUnreadableNumber('Extremizing factor', extremize);
  const extremizeError = extremizeUnreadable.now
    ? UNREADABLE_NUMBER
    : a === null || a < EXTREMIZE_MIN || a > EXTREMIZE_MAX
      ? `Must be between ${EXTREMIZE_MIN} and ${EXTREMIZE_MAX}`
      : undefined;

  function change(key: number, part: 'name' | 'p' | 'weight', value: string) {
    onLensesChange(lenses.map((l) => (l.key === key ? { ...l, [part]: value } : l)));
  }

  function add() {
    const lens = newLens(lenses);
    onLensesChange([...lenses, lens]);
    setFocusKey(lens.key);
  }

  function remove(key: number) {
    onLensesChange(lenses.filter((l) => l.key !== key));
    setFocusKey('add');
  }

  return (
    <details className="tool" open={open || hasErrors} onToggle={(event) => setOpen(event.currentTarget.open)} data-testid="lenses-editor">
      <summary className="tool__summary">
        Lenses{lenses.length ? ` (${lenses.length})` : ''} <span className="tool__summary-hint">— pool several perspectives into a suggestion</span>
      </summary>
      <div className="tool__body" onKeyDown={keepEnter}>
        <p className="tool__explain">
          Write down what each way of looking at the question says on its own. Their pooled number is only a suggestion; the probability you save is
          yours.
        </p>
        {lenses.length > 0 ? (
          <>
            <div className="lens-grid lens-grid--head" aria-hidden="true">
              <span>Lens</span>
              <span>Probability</span>
              <span>Weight</span>
              <span />
            </div>
            <ol className="lens-list" ref={listRef}>
              {lenses.map((lens, i) => (
                <LensRow key={lens.key} lens={lens} label={`Lens ${i + 1}`} idPrefix={`${listId}-${lens.key}`} listId={listId} error={error} onChange={change} onRemove={remove} />
              ))}
            </ol>
            <datalist id={`${listId}-names`}>
              {SUGGESTED_LENS_NAMES.map((name) => (
                <option key={name} value={name} />
              ))}
            </datalist>
          </>
        ) : null}
        <div>
          {lenses.length < MAX_LENSES ? (
            <Button ref={addRef} size="sm" onClick={add}>
              Add lens
            </Button>
          ) : (
            <p className="tool__explain">That is the most one revision keeps ({MAX_LENSES} lenses).</p>
          )}
        </div>
        {lenses.length > 0 ? (
          <div className="tool__result">
            <FieldFrame
              controlId={extremizeId}
              label="Extremizing factor"
              hint="1 is the plain average. Higher pushes the pooled number away from 50%, for lenses that each see only part of the evidence."
              error={extremizeError}
              className="probability"
            >
              <span className="probability__row">
                <input
                  type="range"
                  className="probability__slider"
                  min={EXTREMIZE_MIN}
                  max={EXTREMIZE_MAX}
                  step={0.1}
                  value={sliderValue}
                  aria-label="Extremizing factor (slider)"
                  aria-valuetext={`×${sliderValue}`}
                  onChange={(event) => onExtremizeChange(event.target.value)}
                />
                <input
                  type="number"
                  inputMode="decimal"
                  id={extremizeId}
                  className="input input--number tool__factor"
                  min={EXTREMIZE_MIN}
                  max={EXTREMIZE_MAX}
                  step="any"
                  value={extremize}
                  aria-invalid={extremizeError ? true : undefined}
                  aria-describedby={describedBy(extremizeId, 'hint', extremizeError)}
                  onInput={extremizeUnreadable.onInput}
                  onBlur={extremizeUnreadable.onBlur}
                  onChange={(event) => onExtremizeChange(event.target.value)}
                />
              </span>
            </FieldFrame>
            <p className="tool__headline">
              Pooled suggestion:{' '}
              <output data-testid="lens-suggestion" data-p={pooled.p ?? ''} aria-live="polite">
                {pooled.p === null ? '—' : formatEstimate(pooled.p)}
              </output>
            </p>
            <p className="tool__explain">
              {pooled.p === null
                ? pooled.why
                : `Weighted average of the log-odds of ${whichLenses(pooled.used, lenses.length)}${a !== null && a > 1 ? `, stretched ×${a} away from 50%` : ''}.`}
            </p>
            <div>
              <Button size="sm" variant="primary" disabled={pooled.p === null} onClick={() => pooled.p !== null && onUseSuggestion(estimateText(pooled.p))}>
                Use suggestion
              </Button>
            </div>
          </div>
        ) : null}
      </div>
    </details>
  );
}

interface LensRowProps {
  lens: LensDraft;
  /** "Lens 2". */
  label: string;
  idPrefix: string;
  /** The editor's id, naming the list of suggested names. */
  listId: string;
  error: (field: string) => string | undefined;
  onChange: (key: number, part: 'name' | 'p' | 'weight', value: string) => void;
  onRemove: (key: number) => void;
}

/**
 * One lens: its name, probability and weight, and the reasons beside them. A number box
 * holding text it cannot read ("60-70", "about 2") says so and holds the revision back,
 * instead of the lens being taken as unfilled (`useUnreadableNumber`).
 */
function LensRow({ lens, label, idPrefix, listId, error, onChange, onRemove }: LensRowProps) {
  const nameId = `${idPrefix}-name`;
  const pId = `${idPrefix}-p`;
  const weightId = `${idPrefix}-weight`;
  const unreadableP = useUnreadableNumber(`${label} probability`, lens.p);
  const unreadableWeight = useUnreadableNumber(`${label} weight`, lens.weight);
  const errors = {
    name: error(lensField(lens.key, 'name')),
    p: unreadableP.message ?? (unreadableP.now && error(lensField(lens.key, 'p')) ? UNREADABLE_NUMBER : error(lensField(lens.key, 'p'))),
    weight: unreadableWeight.message ?? (unreadableWeight.now && error(lensField(lens.key, 'weight')) ? UNREADABLE_NUMBER : error(lensField(lens.key, 'weight'))),
  };
  return (
    <li className="lens-grid" data-testid="lens-row">
      <input
        type="text"
        id={nameId}
        className="input"
        list={`${listId}-names`}
        aria-label={`${label} name`}
        value={lens.name}
        maxLength={80}
        aria-invalid={errors.name ? true : undefined}
        aria-describedby={describedBy(nameId, undefined, errors.name)}
        onChange={(event) => onChange(lens.key, 'name', event.target.value)}
      />
      <span className="input-with-suffix">
        <input
          type="number"
          inputMode="decimal"
          id={pId}
          data-lens={lens.key}
          className="input input--number input--percent"
          min={0}
          max={100}
          step="any"
          aria-label={`${label} probability`}
          value={lens.p}
          aria-invalid={errors.p ? true : undefined}
          aria-describedby={[describedBy(pId, undefined, errors.p), hasPercentAdvice(lens.p) ? `${pId}-advice` : ''].filter(Boolean).join(' ') || undefined}
          onKeyDown={commaAsPoint}
          onPaste={pastedPercentText}
          onInput={unreadableP.onInput}
          onBlur={unreadableP.onBlur}
          onChange={(event) => onChange(lens.key, 'p', event.target.value)}
        />
        <span className="input-suffix" aria-hidden="true">
          %
        </span>
      </span>
      <input
        type="number"
        inputMode="decimal"
        id={weightId}
        className="input input--number lens-grid__weight"
        min={0}
        step="any"
        aria-label={`${label} weight`}
        value={lens.weight}
        aria-invalid={errors.weight ? true : undefined}
        aria-describedby={describedBy(weightId, undefined, errors.weight)}
        onInput={unreadableWeight.onInput}
        onBlur={unreadableWeight.onBlur}
        onChange={(event) => onChange(lens.key, 'weight', event.target.value)}
      />
      <Button size="sm" variant="ghost" className="btn--danger-text" onClick={() => onRemove(lens.key)} aria-label={`Remove ${label.toLowerCase()}${lens.name.trim() ? ` (${lens.name.trim()})` : ''}`}>
        Remove
      </Button>
      <div className="lens-grid__errors">
        <FieldError id={`${nameId}-error`} message={errors.name} />
        <FieldError id={`${pId}-error`} message={errors.p} />
        <PercentAdvice value={lens.p} onChange={(value) => onChange(lens.key, 'p', value)} id={`${pId}-advice`} boxId={pId} />
        <FieldError id={`${weightId}-error`} message={errors.weight} />
      </div>
    </li>
  );
}
