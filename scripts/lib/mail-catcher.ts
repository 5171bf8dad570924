// The local stand-in for a hosted mail service: a real SMTP server on loopback (smtp-server) that
// keeps every message, and a small JSON API over HTTP from which the app's mail page and the
// tests read them.
import http from "node:http";
import { type AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface CaughtMessage {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

export interface MailCatcher {
  smtpPort: number;
  httpPort: number;
  messages: CaughtMessage[];
  close(): Promise<void>;
}

export async function startMailCatcher(opts: { smtpPort: number; httpPort: number; host?: string }): Promise<MailCatcher> {
  const host = opts.host ?? "127.0.0.1";
  const messages: CaughtMessage[] = [];
  let nextId = 1;

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          messages.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            from: mail.from?.text ?? session.envelope.mailFrom?.toString() ?? "",
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            html: typeof mail.html === "string" ? mail.html : "",
          });
          if (messages.length > 1000) messages.shift();
          callback();
        })
        .catch((e: Error) => callback(e));
    },
  });

  const api = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", `http://${host}`);
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { "content-type": "application/json" });
      res.end(JSON.stringify(body));
    };
    if (req.method === "DELETE" && url.pathname === "/messages") {
      messages.length = 0;
      return send(200, { deleted: true });
    }
    if (req.method === "GET" && url.pathname === "/messages") {
      const to = url.searchParams.get("to");
      const list = to ? messages.filter((m) => m.to.some((a) => a.toLowerCase() === to.toLowerCase())) : messages;
      return send(200, { messages: [...list].reverse() });
    }
    const one = /^\/messages\/(\d+)$/.exec(url.pathname);
    if (req.method === "GET" && one) {
      const m = messages.find((x) => x.id === Number(one[1]));
      return m ? send(200, m) : send(404, { error: "no such message" });
    }
    send(404, { error: "not found" });
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(opts.smtpPort, host, () => resolve());
  });
  await new Promise<void>((resolve, reject) => {
    api.once("error", reject);
    api.listen(opts.httpPort, host, () => resolve());
  });

  return {
    smtpPort: (smtp.server.address() as AddressInfo).port,
    httpPort: (api.address() as AddressInfo).port,
    messages,
    close: () =>
      Promise.all([
        new Promise<void>((r) => smtp.close(() => r())),
        new Promise<void>((r) => api.close(() => r())),
      ]).then(() => undefined),
  };
}
