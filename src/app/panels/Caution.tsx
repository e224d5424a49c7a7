/** The caution that stays on screen: one line, the details a click away. */
export function Caution() {
  return (
    <aside className="caution" role="note" aria-label="Caution">
      <strong>Simplified model, not a forecast.</strong> For actual conditions defer to official space-weather services.{' '}
      <details>
        <summary>More</summary>
        Boundaries come from a dipole/IGRF field with an idealised magnetopause, tail sheet, ring current and IMF term; real ovals
        differ, and substorms are not modelled. If you go out to watch the night sky: dress for the cold, take care on dark roads, keep
        off private land and follow local rules.
      </details>
    </aside>
  );
}
