/**
 * Only same-site paths may follow sign-in; anything else goes home. Control characters and
 * white space are refused outright: browsers strip some of them, so "/\t/evil.example" would
 * otherwise become the protocol-relative "//evil.example".
 */
export function safeRedirect(to: unknown, fallback = "/manuscripts"): string {
  if (typeof to !== "string" || to.length > 1000 || !to.startsWith("/")) return fallback;
  if (/[\s\u0000-\u001f\u007f\\]/.test(to) || to.startsWith("//")) return fallback;
  const url = new URL(to, "http://steradian.invalid");
  if (url.origin !== "http://steradian.invalid") return fallback;
  return url.pathname + url.search + url.hash;
}
