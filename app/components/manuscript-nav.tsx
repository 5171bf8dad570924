import { NavLink } from "react-router";
import type { ManuscriptAction, MemberRole } from "~/permissions";
import { DemoBadge } from "./ui/notice";
import { RoleTag } from "./role-tag";

type Props = {
  manuscript: { id: string; title: string; journal: string | null; is_demo: boolean };
  role: MemberRole;
  can: Record<ManuscriptAction, boolean>;
};

const tab = ({ isActive }: { isActive: boolean }) =>
  `pb-2 border-b-2 ${isActive ? "border-ink text-ink" : "border-transparent text-ink-soft hover:text-ink"}`;

export function ManuscriptNav({ manuscript, role, can }: Props) {
  const base = `/manuscripts/${manuscript.id}`;
  return (
    <header className="mb-8 border-b border-rule">
      <div className="flex items-baseline gap-4">
        <h1 className="flex-1 text-3xl">{manuscript.title}</h1>
        {manuscript.is_demo ? <DemoBadge /> : null}
        <RoleTag role={role} />
      </div>
      {manuscript.journal ? <p className="mt-1 text-sm text-ink-soft">For {manuscript.journal}</p> : null}
      <nav aria-label="Manuscript" className="mt-5 flex gap-6 text-sm">
        <NavLink end to={base} className={tab}>Overview</NavLink>
        <NavLink to={`${base}/datasets`} className={tab}>Datasets</NavLink>
        <NavLink to={`${base}/figures`} className={tab}>Figures</NavLink>
        <NavLink to={`${base}/members`} className={tab}>Members</NavLink>
        {can["read:audit"] ? <NavLink to={`${base}/audit`} className={tab}>Activity log</NavLink> : null}
      </nav>
    </header>
  );
}
