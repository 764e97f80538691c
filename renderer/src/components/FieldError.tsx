/** The message shown under a field the diary (or the form) did not accept. */
export function FieldError({ id, message }: { id: string; message?: string | undefined }) {
  if (!message) return null;
  return (
    <p className="field-error" id={id} data-testid="field-error">
      <span aria-hidden="true">⚠ </span>
      {message}
    </p>
  );
}
