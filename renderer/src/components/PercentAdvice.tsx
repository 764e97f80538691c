/**
 * What a percent box says about a number that is allowed but probably not meant (see
 * `percentAdvice` in percent.ts): a warning at 0% and 100%, which are saved as typed, and a
 * question when a fraction such as 0.5 is typed — "Did you mean 50%?" — which the form
 * waits for before saving (Use 50% / Keep 0.5%).
 */
import { useState } from 'react';
import { useFieldProblem } from '../forms';
import { percentAdvice, type PercentAdvice as PercentAdviceKind } from '../percent';
import { Button } from './Button';

export interface PercentAdviceProps {
  /** The percent text as typed. */
  value: string;
  onChange: (percentText: string) => void;
  /** Id of the advice, for the box's aria-describedby. */
  id: string;
  /** Id of the percent box: the keyboard goes back to it once the question is answered. */
  boxId: string;
  /**
   * What the user last typed into the box (default: the value). The question is only asked
   * about typing: a stored 0.5% shown again, or a helper's estimate, is not a slip.
   */
  typed?: string | null;
  /**
   * Whether to warn at 0% and 100% (default true). A choice box leaves it off: 0% for an
   * option that cannot happen is ordinary there, and the box's own message suggests it.
   */
  warnCertain?: boolean;
}

/** Whether `value` may have advice to show (so the box can list its id in aria-describedby). */
export function hasPercentAdvice(value: string, warnCertain = true): boolean {
  return shownAdvice(value, warnCertain) !== null;
}

function shownAdvice(value: string, warnCertain: boolean): PercentAdviceKind | null {
  const advice = percentAdvice(value);
  return advice?.kind === 'certain' && !warnCertain ? null : advice;
}

export function PercentAdvice({ value, onChange, id, boxId, typed = value, warnCertain = true }: PercentAdviceProps) {
  const advice = shownAdvice(value, warnCertain);
  // The fraction the user said to keep; typing anything else asks again.
  const [kept, setKept] = useState<string | null>(null);
  const asking = advice?.kind === 'fraction' && kept !== advice.typed && typed?.trim() === advice.typed;
  useFieldProblem(asking ? `Did you mean ${advice.meant}%? Choose below the box.` : null);
  // The answer buttons go away once used; the keyboard goes back to the box, not to the page.
  const backToBox = () => document.getElementById(boxId)?.focus();
  return (
    <div aria-live="polite" className="percent-advice">
      {advice?.kind === 'certain' ? (
        <p className="field-warning" id={id} data-testid="percent-warning">
          <span aria-hidden="true">⚠ </span>
          {advice.message}
        </p>
      ) : null}
      {advice?.kind === 'fraction' ? (
        asking ? (
          <div className="field-question" id={id} data-testid="percent-question">
            <p>
              You typed {advice.typed} in a percent box, which is {advice.typed}%. Did you mean {advice.meant}%?
            </p>
            <span className="field-question__answers">
              <Button size="sm" variant="primary" data-field-question onClick={() => {
                  onChange(advice.meant);
                  backToBox();
                }}>
                Use {advice.meant}%
              </Button>
              <Button
                size="sm"
                onClick={() => {
                  setKept(advice.typed);
                  backToBox();
                }}
              >
                Keep {advice.typed}%
              </Button>
            </span>
          </div>
        ) : kept === advice.typed ? (
          <p className="field__hint" id={id}>
            Keeping {advice.typed}% as typed.
          </p>
        ) : null
      ) : null}
    </div>
  );
}
