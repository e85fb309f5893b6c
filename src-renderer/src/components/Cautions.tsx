/** The standing cautions every screen with results carries. */
export function Cautions() {
  return (
    <aside className="cautions" aria-label="Cautions">
      <strong>Read results with care.</strong> A model describes the counts, not the population: changes in
      detection, observers, effort or timing can move the counts without any change in numbers. Follow your
      programme's own protocol, and have a statistician review any decision that rests on these results.
    </aside>
  );
}
