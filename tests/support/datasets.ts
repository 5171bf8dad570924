import { Client } from "./http";

export const ANGULAR_QUANTITY = { x: { kind: "theta_cm_deg" }, y: { kind: "dsigma_domega", unit: "ub/sr" } };
export const ANGULAR_MAPPING = { x: "theta", y: "dsigma", stat: { kind: "symmetric", column: "stat" } };

/** A small synthetic angular distribution (invented numbers). */
export function angularCsv(values: number[] = [1.5, 1.2, 0.95, 0.81, 0.74], opts: { delimiter?: string; bom?: boolean; crlf?: boolean } = {}) {
  const d = opts.delimiter ?? ",";
  const nl = opts.crlf ? "\r\n" : "\n";
  const lines = [["theta", "dsigma", "stat"].join(d), ...values.map((v, i) => [30 + 15 * i, v, 0.05].join(d))];
  return (opts.bom ? "\uFEFF" : "") + lines.join(nl) + nl;
}

export async function createDatasetViaApi(c: Client, manuscriptId: string, name: string, extra: Record<string, unknown> = {}) {
  const res = await c.postJson(`/api/v1/manuscripts/${manuscriptId}/datasets`, { name, quantity: ANGULAR_QUANTITY, mapping: ANGULAR_MAPPING, ...extra });
  if (res.status !== 201) throw new Error(`creating dataset answered ${res.status}: ${await res.text()}`);
  return ((await res.json()) as { dataset: { id: string } }).dataset.id;
}
