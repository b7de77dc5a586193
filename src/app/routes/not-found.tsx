import { Link, useLocation } from 'react-router-dom';

export function NotFoundRoute() {
  const { pathname } = useLocation();
  return (
    <section className="max-w-xl">
      <h1 className="text-2xl font-bold mb-2">No such page</h1>
      <p className="text-ink-soft mb-4">
        Nothing lives at <code className="font-mono bg-panel px-1 rounded">{pathname}</code>.
      </p>
      <Link to="/" className="underline">Go to the overview</Link>
    </section>
  );
}
