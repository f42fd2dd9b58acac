import { Link } from 'react-router';
import { paths } from '@client/config/paths';

export default function NotFoundRoute() {
  return (
    <main className="mx-auto max-w-xl p-6">
      <h1 className="text-2xl">Nothing here</h1>
      <p className="mt-2 text-ink-soft">This address does not lead to a Brineline screen.</p>
      <Link className="mt-4 inline-block rounded bg-hull px-4 py-3 font-bold text-paper" to={paths.home}>
        Back to the start
      </Link>
    </main>
  );
}
