import nodemailer, { type TransportOptions } from "nodemailer";
import { env } from "./env.server";

const transport = nodemailer.createTransport({
  url: env.SMTP_URL,
  // The local catcher speaks plain SMTP on loopback; a real relay is configured by SMTP_URL.
  ...(env.SMTP_URL.includes("127.0.0.1") || env.SMTP_URL.includes("localhost") ? { secure: false, ignoreTLS: true } : {}),
} as TransportOptions);

export interface Message {
  to: string;
  subject: string;
  /** Paragraphs of plain text; the HTML part is built from the same words. */
  paragraphs: string[];
  action?: { label: string; url: string };
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

export function renderMessage(m: Message): { text: string; html: string } {
  const text = [...m.paragraphs, ...(m.action ? [`${m.action.label}: ${m.action.url}`] : []), "— Steradian"].join("\n\n");
  const html = `<!doctype html><html><body style="font-family: sans-serif; color: #2b2a27; background: #faf7f0; padding: 24px">
${m.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join("\n")}
${m.action ? `<p><a href="${escapeHtml(m.action.url)}" style="color: #7a3b12">${escapeHtml(m.action.label)}</a></p>` : ""}
<p style="color: #6b675e">— Steradian</p></body></html>`;
  return { text, html };
}

export async function sendMail(m: Message): Promise<void> {
  const { text, html } = renderMessage(m);
  await transport.sendMail({ from: env.MAIL_FROM, to: m.to, subject: m.subject, text, html });
}

export function appLink(path: string): string {
  return new URL(path, env.APP_URL).toString();
}
