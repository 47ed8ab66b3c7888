/** The caution of design.md §10, wherever tension marks are shown. */
export function HealthCaution({ text }: { text: string }) {
  return (
    <aside className="sm-caution" role="note" aria-label="Health caution">
      <strong>Health caution.</strong> {text}
    </aside>
  );
}
