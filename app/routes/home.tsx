import { Link, redirect } from "react-router";
import type { Route } from "./+types/home";
import { optionalUser } from "~/.server/platform/http/guards.server";

export async function loader({ request }: Route.LoaderArgs) {
  if (await optionalUser(request)) throw redirect("/manuscripts");
  return null;
}

export default function Home() {
  return (
    <article className="mx-auto mt-8 max-w-3xl">
      <h1 className="text-4xl leading-tight">Measured cross sections, set against the Born prediction, ready for the journal.</h1>
      <p className="mt-5 text-lg text-ink-soft">
        Steradian keeps each dataset as numbered, fingerprinted revisions, computes tree-level QED and scalar-QED
        predictions with its own engine, and ties every sealed figure to the exact data and parameters behind it —
        so that co-authors sign off on what will be printed, and the files sent to the journal match it.
      </p>
      <ol className="mt-8 grid grid-cols-3 gap-px border border-rule bg-rule text-sm">
        {["Upload data", "Overlay predictions", "Seal, sign off, export"].map((s, i) => (
          <li key={s} className="bg-sheet p-4"><span className="font-mono text-ink-faint">{i + 1}</span> {s}</li>
        ))}
      </ol>
      <p className="mt-8 flex gap-4">
        <Link to="/sign-in" className="bg-madder px-4 py-2 text-sheet hover:bg-madder-dark">Sign in</Link>
        <Link to="/sign-up" className="border border-rule-strong px-4 py-2 hover:border-ink">Create an account</Link>
        <Link to="/predictions" className="px-4 py-2 underline underline-offset-4">Try the predictions</Link>
      </p>
      <p className="mt-2 text-sm text-ink-soft">
        The predictions are for signed-in users: “Try the predictions” asks you to sign in (or to create an account) first, then opens them.
      </p>
    </article>
  );
}
