import { Link } from 'react-router-dom';
import { useMe } from '../../features/auth/api/get-me';
import { BenchPage } from '../../features/bench/components/bench-page';

export function BenchRoute() {
  const me = useMe();
  // Running the bench is an engineer's job (the server refuses a reviewer's saves as well).
  if (me.data?.role === 'reviewer') {
    return (
      <section className="max-w-xl rounded-lg border border-rule bg-panel p-6">
        <h1 className="text-2xl font-bold mb-2">The bench is for engineers</h1>
        <p className="text-ink-soft mb-4">
          Reviewers read, compare and sign off saved sessions; driving a board takes the engineer role. An admin
          can change your role.
        </p>
        <Link to="/" className="underline">Back to the overview</Link>
      </section>
    );
  }
  return <BenchPage />;
}
