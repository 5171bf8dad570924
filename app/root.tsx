import "./zod-jitless";
import { Links, Meta, Outlet, Scripts, ScrollRestoration, isRouteErrorResponse, useRouteLoaderData } from "react-router";
import { useContext } from "react";
import type { Route } from "./+types/root";
import { CspNonceContext } from "./csp-nonce";
import "./app.css";
import { optionalUser } from "./.server/platform/http/guards.server";
import { db } from "./.server/platform/db.server";
import { unreadCount } from "./.server/versions/notifications.server";
import { SiteHeader } from "./components/site-header";
import { ErrorPage } from "./components/error-page";

export async function loader({ request }: Route.LoaderArgs) {
  const user = await optionalUser(request);
  return { user, unread: user ? await unreadCount(db, user.id, new URL(request.url).pathname.replace(/\.data$/, "")) : 0 };
}

// The header's inbox count stays true on every navigation (one small query).
export const shouldRevalidate = () => true;

export function Layout({ children }: { children: React.ReactNode }) {
  const data = useRouteLoaderData<typeof loader>("root");
  const nonce = useContext(CspNonceContext);
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width, initial-scale=1" />
        <Meta />
        <Links />
      </head>
      <body className="min-h-screen bg-paper text-ink antialiased">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-2 focus:z-50 focus:bg-sheet focus:px-3 focus:py-2">Skip to the content</a>
        <SiteHeader user={data?.user ?? null} unread={data?.unread ?? 0} />
        <main id="main" tabIndex={-1} className="mx-auto max-w-6xl px-6 pb-16 pt-6">{children}</main>
        <ScrollRestoration nonce={nonce} />
        <Scripts nonce={nonce} />
      </body>
    </html>
  );
}

export default function App() {
  return <Outlet />;
}

export const meta: Route.MetaFunction = () => [{ title: "Steradian" }];

export const links: Route.LinksFunction = () => [{ rel: "icon", href: "/favicon.svg", type: "image/svg+xml" }];

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) {
    const message = typeof error.data === "object" && error.data && "message" in error.data ? String(error.data.message) : undefined;
    return <ErrorPage status={error.status} message={message} />;
  }
  const dev = import.meta.env.DEV;
  return <ErrorPage status={500} message={dev && error instanceof Error ? error.message : undefined} stack={dev && error instanceof Error ? error.stack : undefined} />;
}
