/** A field's validation message, linked to its input with aria-describedby. */
export function FieldError({ id, message }: { id: string; message: string | undefined }) {
  if (!message) return null;
  return (
    <small id={id} className="sm-field-error">
      {message}
    </small>
  );
}
