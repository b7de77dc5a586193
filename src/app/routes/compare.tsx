// Placeholder until the page lands: the route exists so links to it resolve.
export function CompareRoute() {
  return <p className="text-ink-soft">This page is being built.</p>;
}
