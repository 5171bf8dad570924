/** Only same-site paths may follow sign-in; anything else goes home. */
export function safeRedirect(to: unknown, fallback = "/manuscripts"): string {
  if (typeof to !== "string" || !to.startsWith("/") || to.startsWith("//") || to.startsWith("/\\")) return fallback;
  return to;
}
