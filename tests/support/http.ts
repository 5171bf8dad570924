import { testEnv } from "./env";

/** A tiny browser stand-in: keeps cookies, does not follow redirects, sends forms. */
export class Client {
  cookies = new Map<string, string>();
  constructor(readonly base = testEnv.appUrl) {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  async request(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size && !headers.has("Cookie")) headers.set("Cookie", this.cookieHeader());
    // A browser names the page's origin on every write; the app refuses cookie writes without it.
    if (!["GET", "HEAD"].includes((init.method ?? "GET").toUpperCase()) && !headers.has("Origin")) headers.set("Origin", new URL(this.base).origin);
    // `Origin: ""` asks for a write without any Origin header (as a non-browser client sends it).
    if (headers.get("Origin") === "") headers.delete("Origin");
    const res = await fetch(new URL(path, this.base), { ...init, headers, redirect: "manual" });
    for (const c of res.headers.getSetCookie()) {
      const [pair, ...attrs] = c.split(";");
      const i = pair.indexOf("=");
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      const expired = attrs.some((a) => /^\s*expires=thu, 01 jan 1970/i.test(a) || /^\s*max-age=0\s*$/i.test(a));
      if (expired || value === "") this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return res;
  }

  get(path: string, headers: Record<string, string> = {}) {
    return this.request(path, { headers });
  }

  /** A plain HTML form POST, as the browser sends it without JavaScript. */
  post(path: string, fields: Record<string, string>, headers: Record<string, string> = {}) {
    return this.request(path, { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded", ...headers }, body: new URLSearchParams(fields).toString() });
  }

  postJson(path: string, body: unknown, headers: Record<string, string> = {}) {
    return this.request(path, { method: "POST", headers: { "content-type": "application/json", ...headers }, body: JSON.stringify(body) });
  }

  /** A multipart upload of one CSV file, as a browser or a script sends it. */
  upload(path: string, csv: string | Uint8Array, fields: Record<string, string> = {}, fileName = "data.csv", headers: Record<string, string> = {}) {
    const form = new FormData();
    for (const [k, v] of Object.entries(fields)) form.set(k, v);
    form.set("file", new Blob([csv as BlobPart], { type: "text/csv" }), fileName);
    return this.request(path, { method: "POST", headers, body: form });
  }

  async signIn(email: string, password: string): Promise<Response> {
    const res = await this.post("/sign-in", { email, password });
    if (res.status !== 302) throw new Error(`sign-in as ${email} answered ${res.status}: ${await res.text()}`);
    return res;
  }
}

export const DEMO = {
  password: "demo-steradian-2026",
  contributor: "ada.contributor@example.org",
  coauthor: "bruno.coauthor@example.org",
  corresponding: "carla.corresponding@example.org",
  admin: "admin@example.org",
  manuscriptId: "5e7ad1a0-0000-4000-8000-00000000d3e0",
};
