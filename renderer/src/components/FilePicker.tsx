/**
 * Choosing a file, styled like the app's buttons rather than the browser's own "Choose File
 * / No file chosen" control. The native input stays underneath (visually hidden, still
 * focusable and named by the label), so the keyboard, screen readers and drag-and-drop onto
 * the button work as the browser made them.
 */
import { useId, type ChangeEvent, type MouseEvent } from 'react';

export interface FilePickerProps {
  /** What the button says, e.g. "Import a diary file…". */
  label: string;
  /** Which files, as the input's `accept`. */
  accept: string;
  onFile: (file: File) => void;
  disabled?: boolean;
  /** A line beside the button, e.g. the formats taken or what is happening. */
  note?: string;
}

export function FilePicker({ label, accept, onFile, disabled, note }: FilePickerProps) {
  const id = useId();
  function onChange(event: ChangeEvent<HTMLInputElement>) {
    const file = event.target.files?.[0];
    // Cleared at once, so choosing the same file again (after fixing it) still counts as a change.
    event.target.value = '';
    if (file && !disabled) onFile(file);
  }
  // While disabled the input stays focusable (aria-disabled, the file dialog not opened): the
  // native `disabled` on the input just used would send the keyboard's place back to the
  // start of the page while the file is read, and leave it there.
  function onClick(event: MouseEvent<HTMLInputElement>) {
    if (disabled) event.preventDefault();
  }
  return (
    <span className="file-picker">
      <input id={id} className="file-picker__input" type="file" accept={accept} onChange={onChange} onClick={onClick} aria-disabled={disabled || undefined} aria-describedby={note ? `${id}-note` : undefined} />
      <label htmlFor={id} className={`btn btn--secondary btn--md file-picker__button ${disabled ? 'file-picker__button--disabled' : ''}`}>
        <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" focusable="false">
          <path d="M8 11V2M4.5 5.5L8 2l3.5 3.5M2.5 10.5v3h11v-3" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
        {label}
      </label>
      {note ? (
        <span className="muted file-picker__note" id={`${id}-note`}>
          {note}
        </span>
      ) : null}
    </span>
  );
}
