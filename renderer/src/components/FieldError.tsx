/** A reason as a sentence: "must be a date" → "Must be a date". Every field message reads alike. */
export function sentence(reason: string): string {
  return reason.charAt(0).toUpperCase() + reason.slice(1);
}

/** The message shown under a field the diary (or the form) did not accept. */
export function FieldError({ id, message }: { id: string; message?: string | undefined }) {
  if (!message) return null;
  return (
    <p className="field-error" id={id} data-testid="field-error">
      <span aria-hidden="true">⚠ </span>
      {sentence(message)}
    </p>
  );
}
