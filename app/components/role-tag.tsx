import { type MemberRole, ROLE_LABELS } from "~/permissions";

// Each role has its own shape as well as its word, so nothing depends on colour.
const SHAPES: Record<MemberRole, string> = { corresponding: "■", coauthor: "●", contributor: "▲", observer: "○" };

export function RoleTag({ role }: { role: MemberRole }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm text-ink-soft">
      <span aria-hidden="true" className="text-xs">{SHAPES[role]}</span>
      {ROLE_LABELS[role]}
    </span>
  );
}
