import { Form, NavLink } from "react-router";
import type { SessionUser } from "~/session-user";

const link = ({ isActive }: { isActive: boolean }) =>
  `px-1 pb-1 border-b-2 ${isActive ? "border-madder text-ink" : "border-transparent text-ink-soft hover:text-ink"}`;

export function SiteHeader({ user, unread = 0 }: { user: SessionUser | null; unread?: number }) {
  return (
    <header className="border-b border-rule bg-sheet">
      <div className="mx-auto flex max-w-6xl items-center gap-8 px-6 py-3">
        <NavLink to={user ? "/manuscripts" : "/"} className="flex items-baseline gap-2" aria-label="Steradian, home">
          <SteradianMark />
          <span className="font-serif text-xl tracking-wide">Steradian</span>
        </NavLink>
        {user ? (
          <nav aria-label="Main" className="flex flex-1 items-center gap-6 text-sm">
            <NavLink to="/manuscripts" className={link}>Manuscripts</NavLink>
            <NavLink to="/predictions" className={link}>Predictions</NavLink>
            {user.siteRole === "admin" ? (
              <>
                <NavLink to="/admin/accounts" className={link}>Accounts</NavLink>
                <NavLink to="/admin/mail" className={link}>Mail</NavLink>
              </>
            ) : null}
            <span className="flex-1" />
            <NavLink to="/inbox" className={link} data-testid="inbox-link">
              Inbox{unread > 0 ? <><span className="ml-1.5 inline-block min-w-5 rounded-full bg-ink px-1.5 text-center font-mono text-xs text-sheet" data-testid="inbox-count">{unread}</span><span className="sr-only"> unread</span></> : null}
            </NavLink>
            <NavLink to="/account" className={link}>{user.name}</NavLink>
            <Form method="post" action="/sign-out">
              <button type="submit" className="text-ink-soft hover:text-ink">Sign out</button>
            </Form>
          </nav>
        ) : (
          <nav aria-label="Main" className="flex flex-1 justify-end gap-6 text-sm">
            <NavLink to="/predictions" className={link}>Predictions</NavLink>
            <NavLink to="/sign-in" className={link}>Sign in</NavLink>
            <NavLink to="/sign-up" className={link}>Create an account</NavLink>
          </nav>
        )}
      </div>
    </header>
  );
}

/** The product's mark: a cone of solid angle cut by a sphere — drawn, not borrowed. */
function SteradianMark() {
  return (
    <svg width="20" height="20" viewBox="0 0 20 20" aria-hidden="true" className="self-center">
      <circle cx="10" cy="10" r="8.5" fill="none" stroke="currentColor" strokeWidth="1" />
      <path d="M10 10 L16.5 4.5 A8.5 8.5 0 0 1 18.2 12.3 Z" fill="var(--color-madder)" />
    </svg>
  );
}
