/** The short caution shown wherever tension is assessed (design.md §10). */
export function HealthCaution() {
  return (
    <p className="sm-health-caution" role="note">
      <strong>Health note.</strong> Persistent tension can contribute to playing-related pain. If a
      student reports pain, stop and seek advice from a qualified health professional. Stavemark
      records teaching observations; it does not diagnose.
    </p>
  );
}
