import { useSearchParams } from 'react-router-dom';

/** The sign-in page: one button that starts the OAuth flow (the local provider in development). */
export function SignInPage() {
  const [params] = useSearchParams();
  const failed = params.get('error');
  return (
    <main className="flex min-h-screen items-center justify-center p-4">
      <div className="w-full max-w-md rounded-xl border border-line bg-card p-8 shadow-sm">
        <div className="mb-6 flex items-center gap-3">
          <img src="/favicon.svg" alt="" className="h-10 w-10" />
          <div>
            <h1 className="text-2xl font-bold">Midgray</h1>
            <p className="text-sm text-ink-soft">The production desk for camera and lens test episodes</p>
          </div>
        </div>
        {failed && (
          <p className="mb-4 rounded-md bg-danger-soft p-3 text-sm text-danger" role="alert">
            Sign-in did not complete. Try again.
          </p>
        )}
        <p className="mb-6 text-sm text-ink-soft">Plan the test, shoot it to spec, hand the footage to the edit, measure it and get the publish date approved: one place for the whole team.</p>
        <a href="/api/auth/github" className="flex min-h-11 w-full items-center justify-center rounded-md bg-accent px-4 font-semibold text-white hover:bg-accent-strong">
          Sign in with your code-hosting account
        </a>
        <p className="mt-4 text-xs text-ink-muted">Invited to a channel? Sign in with the account that uses the invited e-mail address and you join it straight away.</p>
      </div>
    </main>
  );
}
