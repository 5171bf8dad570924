import { testEnv } from "./env";

export interface CaughtMessage { id: number; to: string[]; subject: string; text: string; html: string }

/** Waits for the newest message to an address in the local mail catcher. */
export async function waitForMail(to: string, match: (m: CaughtMessage) => boolean = () => true, timeoutMs = 10_000): Promise<CaughtMessage> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const res = await fetch(`${testEnv.mailUrl}/messages?to=${encodeURIComponent(to)}`);
    const { messages } = (await res.json()) as { messages: CaughtMessage[] };
    const m = messages.find(match);
    if (m) return m;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no message to ${to} arrived within ${timeoutMs} ms`);
}

export function linkIn(m: CaughtMessage, path: string): string {
  const re = new RegExp(`https?://[^\\s"<>]+${path.replace(/[/]/g, "\\/")}[^\\s"<>]*`);
  const found = re.exec(m.text);
  if (!found) throw new Error(`no link to ${path} in message "${m.subject}":\n${m.text}`);
  return found[0];
}
