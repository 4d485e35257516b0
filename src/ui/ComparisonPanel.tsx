/** The Comparison panel: the glyph-style comparison table, with a button that adopts a row. */
export function ComparisonPanel() {
  return (
    <section class="panel" aria-labelledby="compare-h">
      <h2 id="compare-h">Comparison</h2>
      <p class="muted">The glyph-style comparison appears here once the comparison stage is available.</p>
    </section>
  );
}
