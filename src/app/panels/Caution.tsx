/** The caution that stays on screen. */
export function Caution() {
  return (
    <aside className="caution" role="note" aria-label="Caution">
      <strong>Simplified model, not a forecast.</strong> Boundaries come from a dipole/IGRF field with an idealised
      magnetopause, tail sheet and IMF term; real ovals differ, and substorms are not modelled. For actual conditions defer to official space-weather services.
      If you go out to watch the night sky: dress for the cold, take care on dark roads, keep off private land and follow local rules.
    </aside>
  );
}
