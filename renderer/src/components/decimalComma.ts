/**
 * A decimal comma in a percent box. Chromium's number box drops a typed "," when the locale
 * writes decimals with a point, so "0,7" became "07" — 7% saved without a word, where the
 * user meant 0.7 (and then 70%). In a percent box a comma can only be a decimal comma (no
 * percent runs to thousands), so it is typed as a point: "0,7" reads 0.7, and the box's
 * own advice then asks whether 70% was meant. Pasted text gets the same reading: the box
 * would keep only its digits, "07".
 *
 * Number boxes for a question's values are left alone: there "1,000" is a thousands comma,
 * and dropping it keeps the number the user meant.
 */
import type { ClipboardEvent, KeyboardEvent } from 'react';

export function commaAsPoint(event: KeyboardEvent<HTMLInputElement>): void {
  if (event.key !== ',' || event.ctrlKey || event.metaKey || event.altKey) return;
  event.preventDefault();
  // insertText goes through the browser's own editing, so the change event fires and Undo
  // takes the point back; number boxes offer no selection API to splice it in by hand.
  document.execCommand('insertText', false, '.');
}

/**
 * Pasted text in a percent box (onPaste beside commaAsPoint): "0,7" goes in as "0.7", and a
 * percent copied with its sign ("35%", "12,5 %") as the number, "35" or "12.5" — the number
 * box would refuse the whole paste for the sign it cannot hold, and the box already says %.
 */
export function pastedPercentText(event: ClipboardEvent<HTMLInputElement>): void {
  const text = event.clipboardData.getData('text/plain');
  if (!text.includes(',') && !text.includes('%')) return;
  event.preventDefault();
  document.execCommand('insertText', false, text.trim().replace(/\s*%$/, '').replaceAll(',', '.'));
}
