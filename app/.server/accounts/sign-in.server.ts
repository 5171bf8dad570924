import bcrypt from "bcryptjs";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { z } from "zod";
import { recordAudit } from "../platform/audit.server";
import { db, type Db } from "../platform/db.server";
import { env } from "../platform/env.server";
import { findUserByEmail, type SessionUser, verifyPassword } from "./users.server";

/** One message for an unknown address and a wrong password, so neither reveals an account. */
export const BAD_CREDENTIALS = "That e-mail address and password do not match an active account.";

export class SignInError extends Error {
  constructor(
    message: string,
    readonly field: "email" | "password" | null = null,
    readonly status = 401,
  ) {
    super(message);
  }
}

export const SignInForm = z.object({
  email: z.string().trim().min(3, "Enter your e-mail address.").max(254, "At most 254 characters.").email("Enter an e-mail address like name@example.org."),
  password: z.string().min(1, "Enter your password.").max(200, "At most 200 characters."),
  // A target too long to be one of ours is dropped rather than blocking the sign-in.
  redirectTo: z.string().max(1000).optional().catch(undefined),
});

// Runs bcrypt even for unknown addresses so that timing does not tell them apart.
let dummyHash: string | undefined;
function dummy(): string {
  return (dummyHash ??= bcrypt.hashSync("no account has this password", env.BCRYPT_COST));
}

async function recentFailures(db: Db, column: "email" | "ip", value: string): Promise<number> {
  const since = new Date(Date.now() - env.SIGN_IN_WINDOW_MINUTES * 60_000);
  const row = await db
    .selectFrom("sign_in_attempt")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where(column, "=", value)
    .where("succeeded", "=", false)
    .where("at", ">", since)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function checkThrottle(db: Db, email: string, ip: string): Promise<void> {
  const [byAccount, byAddress] = await Promise.all([recentFailures(db, "email", email), recentFailures(db, "ip", ip)]);
  if (byAccount >= env.SIGN_IN_MAX_FAILURES_PER_ACCOUNT || byAddress >= env.SIGN_IN_MAX_FAILURES_PER_ADDRESS) {
    throw new SignInError(
      `Too many failed sign-ins. Wait ${env.SIGN_IN_WINDOW_MINUTES} minutes, or reset your password by e-mail.`,
      null,
      429,
    );
  }
}

export async function verifyCredentials(db: Db, email: string, password: string, ip: string): Promise<SessionUser> {
  await checkThrottle(db, email, ip);
  const user = await findUserByEmail(db, email);
  const ok = await verifyPassword(password, user?.password_hash ?? dummy());
  const good = Boolean(user && user.password_hash && ok && user.status === "active");
  await db.insertInto("sign_in_attempt").values({ email, ip, succeeded: good }).execute();
  await recordAudit(db, { action: good ? "sign-in" : "sign-in-failed", actorId: user?.id ?? null, ip, detail: { email } });
  if (!good || !user) {
    if (user && ok && user.status === "pending") {
      throw new SignInError("Confirm your e-mail address first: follow the link in the message we sent you.");
    }
    throw new SignInError(BAD_CREDENTIALS);
  }
  return { id: user.id, email: user.email, name: user.name, siteRole: user.site_role, isDemo: user.is_demo };
}

export function createAuthenticator(ip: string) {
  const authenticator = new Authenticator<SessionUser>();
  authenticator.use(
    new FormStrategy(async ({ form }) => {
      const parsed = SignInForm.safeParse(Object.fromEntries(form));
      if (!parsed.success) {
        const issue = parsed.error.issues[0];
        throw new SignInError(issue.message, issue.path[0] === "password" ? "password" : "email", 422);
      }
      return verifyCredentials(db, parsed.data.email, parsed.data.password, ip);
    }),
    "form",
  );
  return authenticator;
}
