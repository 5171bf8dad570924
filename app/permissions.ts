// One matrix of role × action decides every loader, action and API route; the UI reads the same
// matrix to hide what a role cannot do. Pure: shared by server and browser.
export const MEMBER_ROLES = ["corresponding", "coauthor", "contributor", "observer"] as const;
export type MemberRole = (typeof MEMBER_ROLES)[number];

export const ROLE_LABELS: Record<MemberRole, string> = {
  corresponding: "corresponding author",
  coauthor: "co-author",
  contributor: "contributor",
  observer: "observer",
};

export const MANUSCRIPT_ACTIONS = [
  "read:manuscript",
  "update:manuscript",
  "manage:members",
  "read:audit",
  "create:dataset",
  "upload:revision",
  "read:dataset",
  "download:raw",
  "edit:figure",
  "seal:figure",
  "request:signoff",
  "signoff:version",
  "comment:version",
  "export:version",
] as const;
export type ManuscriptAction = (typeof MANUSCRIPT_ACTIONS)[number];

const ALL: readonly MemberRole[] = MEMBER_ROLES;
const AUTHORS: readonly MemberRole[] = ["corresponding", "contributor"];

export const PERMISSIONS: Record<ManuscriptAction, readonly MemberRole[]> = {
  "read:manuscript": ALL,
  "update:manuscript": ["corresponding"],
  "manage:members": ["corresponding"],
  "read:audit": ["corresponding"],
  "create:dataset": AUTHORS,
  "upload:revision": AUTHORS,
  "read:dataset": ALL,
  "download:raw": ["corresponding", "coauthor", "contributor"],
  "edit:figure": AUTHORS,
  "seal:figure": AUTHORS,
  "request:signoff": AUTHORS,
  "signoff:version": ["coauthor", "corresponding"],
  "comment:version": ["corresponding", "coauthor", "contributor"],
  "export:version": ["corresponding"],
};

export const SITE_ACTIONS = ["manage:accounts", "read:mail"] as const;
export type SiteAction = (typeof SITE_ACTIONS)[number];

export function can(role: MemberRole | null | undefined, action: ManuscriptAction): boolean {
  return role != null && PERMISSIONS[action].includes(role);
}

export function canSite(siteRole: "member" | "admin", _action: SiteAction): boolean {
  return siteRole === "admin";
}

/** The roles that may perform an action, in words, for a 403 page. */
export function rolesFor(action: ManuscriptAction): string {
  const names = PERMISSIONS[action].map((r) => ROLE_LABELS[r]);
  return names.length === 1 ? names[0] : `${names.slice(0, -1).join(", ")} or ${names[names.length - 1]}`;
}

/** Every action a role may perform, for the UI. */
export function capabilities(role: MemberRole | null): Record<ManuscriptAction, boolean> {
  return Object.fromEntries(MANUSCRIPT_ACTIONS.map((a) => [a, can(role, a)])) as Record<ManuscriptAction, boolean>;
}
