export default function SignInRoute() {
  return (
    <main className="mx-auto max-w-md p-4 sm:p-6">
      <h1 className="text-2xl">Sign in</h1>
      <p className="mt-2 text-ink-soft">Accounts arrive with the accounts work.</p>
    </main>
  );
}
