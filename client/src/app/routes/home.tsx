import { Link, Navigate } from 'react-router';
import { paths } from '@client/config/paths';
import { useHealth } from '@client/features/status/api/get-health';
import { useSession } from '@client/lib/session';

export default function HomeRoute() {
  const health = useHealth();
  const { user } = useSession();
  if (user) return <Navigate to={paths.surveys} replace />;
  return (
    <main className="mx-auto max-w-3xl p-4 sm:p-6">
      <h1 className="text-3xl">Flooding loads, worked out on deck</h1>
      <p className="mt-3 text-lg text-ink-soft">
        Model the flooded compartments of a damaged ship, read the load that water and oil put on every bulkhead,
        deck, hatch cover, door and patch, and send the survey ashore for review when a link appears.
      </p>
      <Link
        to={paths.signIn}
        className="mt-6 inline-flex min-h-touch items-center rounded-lg bg-hull px-6 text-lg font-bold text-paper"
      >
        Sign in
      </Link>
      <p className="mt-6 text-sm text-ink-soft" data-testid="server-status">
        Server:{' '}
        {health.isPending ? 'checking…' : health.data?.db === 'ok' ? `reachable (version ${health.data.version})` : 'not reachable — working from this device'}
      </p>
    </main>
  );
}
