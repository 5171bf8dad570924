export type CsvDelimiter = "," | ";" | "\t";

const CANDIDATES: CsvDelimiter[] = [",", ";", "\t"];

/**
 * The delimiter of a CSV file, chosen from its header line: whichever of comma, semicolon and
 * tab occurs most often outside quotes (comma on a tie or when none occurs). Only the header
 * is looked at, because data rows written with decimal commas would mislead a count over them.
 * `start` is the beginning of the file; it may end in the middle of the first line.
 */
export function detectDelimiter(start: string): CsvDelimiter {
  const counts = new Map<string, number>(CANDIDATES.map((c) => [c, 0]));
  let quoted = false;
  for (let i = start.charCodeAt(0) === 0xfeff ? 1 : 0; i < start.length; i++) {
    const ch = start[i];
    if (ch === '"') {
      quoted = !quoted;
      continue;
    }
    if (quoted) continue;
    if (ch === "\n" || ch === "\r") break;
    const n = counts.get(ch);
    if (n !== undefined) counts.set(ch, n + 1);
  }
  let best: CsvDelimiter = ",";
  for (const c of CANDIDATES) if ((counts.get(c) ?? 0) > (counts.get(best) ?? 0)) best = c;
  return best;
}
