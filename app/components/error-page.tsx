import { Link } from "react-router";

const TITLES: Record<number, { title: string; hint: string }> = {
  400: { title: "That request was not understood", hint: "Check the address or the form and try again." },
  401: { title: "Sign in to continue", hint: "Your session has ended or you are not signed in." },
  403: { title: "Your role does not allow this", hint: "Ask a corresponding author of the manuscript for a different role." },
  404: { title: "Nothing here", hint: "The page or item does not exist, or it is not visible to you." },
  413: { title: "Too large", hint: "The upload exceeds a limit." },
  422: { title: "Some input could not be used", hint: "Correct the fields named below." },
  429: { title: "Too many attempts", hint: "Wait a few minutes and try again." },
  500: { title: "Something went wrong on our side", hint: "The error has been logged. Try again, and tell the site admin if it persists." },
};

/** One error page for every status; the stack trace only in development. */
export function ErrorPage({ status, message, stack }: { status: number; message?: string; stack?: string }) {
  const t = TITLES[status] ?? TITLES[500];
  return (
    <section className="mx-auto mt-10 max-w-2xl border-t border-rule pt-8" aria-labelledby="error-title">
      <p className="font-mono text-sm text-ink-faint">{status}</p>
      <h1 id="error-title" className="mt-1 text-3xl">{t.title}</h1>
      {message ? <p className="mt-4 text-lg">{message}</p> : null}
      <p className="mt-3 text-ink-soft">{t.hint}</p>
      <p className="mt-6"><Link className="underline decoration-rule-strong underline-offset-4 hover:text-madder" to="/manuscripts">Back to your manuscripts</Link></p>
      {stack ? <pre className="mt-8 overflow-auto border border-rule bg-sheet p-4 text-xs">{stack}</pre> : null}
    </section>
  );
}
