/**
 * A number box holding text the browser cannot read as one number ("60-70", "1.2.3", "20e"
 * from "20 weeks" typed) reports its value as '' while the text stays on screen. To the form
 * that is an empty box: a required one said "Enter a value" beside visible digits, and an
 * optional one (a base rate, a first forecast) was saved as not given, dropping what was typed.
 *
 * `useUnreadableNumber` watches the box's own validity on every input (React's onChange stays
 * silent while the value stays '') and reports the problem to the form at once, so the save
 * waits; the message shows once the box is left or a save was refused, as a date box's does,
 * so it does not flash while a number is half-typed.
 */
import { useState, type FocusEvent, type FormEvent } from 'react';
import { useFieldProblem, useSaveRefused } from '../forms';
import { afterPress } from './afterPress';

export const UNREADABLE_NUMBER = 'This is not one number. Type a single number such as 12.5, without ranges or words.';

export interface UnreadableNumber {
  /** The message to show beside the box, or undefined. */
  message: string | undefined;
  /** The box holds text it cannot read, whether or not the message shows yet: any other reason for it being empty is wrong. */
  now: boolean;
  onInput: (event: FormEvent<HTMLInputElement>) => void;
  onBlur: (event: FocusEvent<HTMLInputElement>) => void;
}

/** `value` is the box's value as the form keeps it: text the box cannot read always comes as ''. */
export function useUnreadableNumber(label: string, value: string): UnreadableNumber {
  const [unreadable, setUnreadable] = useState(false);
  const [left, setLeft] = useState(false);
  const refused = useSaveRefused();
  // A number set from elsewhere (the slider, "Use 65%", a reset) replaced the text.
  if (unreadable && value !== '') setUnreadable(false);
  useFieldProblem(unreadable ? `${label}: ${UNREADABLE_NUMBER}` : null);
  return {
    message: unreadable && (left || refused) ? UNREADABLE_NUMBER : undefined,
    now: unreadable,
    onInput: (event) => {
      setUnreadable(event.currentTarget.validity.badInput);
      setLeft(false);
    },
    onBlur: (event) => {
      setUnreadable(event.currentTarget.validity.badInput);
      afterPress(() => setLeft(true));
    },
  };
}
