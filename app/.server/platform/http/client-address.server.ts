/** The client's address as the server saw it (see TRUST_PROXY), or "local" when there is none. */
export function clientIp(context: unknown): string {
  const ip = (context as { ip?: unknown } | undefined)?.ip;
  return typeof ip === "string" && ip ? ip : "local";
}
