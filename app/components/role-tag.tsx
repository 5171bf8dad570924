import { type MemberRole, ROLE_LABELS } from "~/permissions";
import { Shape, type ShapeName } from "./ui/shape";

// Each role has its own shape as well as its word, so nothing depends on colour.
const SHAPES: Record<MemberRole, ShapeName> = { corresponding: "square", coauthor: "disc", contributor: "triangle", observer: "ring" };

export function RoleTag({ role }: { role: MemberRole }) {
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap text-sm text-ink-soft">
      <Shape name={SHAPES[role]} />
      {ROLE_LABELS[role]}
    </span>
  );
}
