import { type RouteConfig, index, prefix, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),
  route("sign-in", "routes/sign-in.tsx"),
  route("sign-out", "routes/sign-out.tsx"),
  route("sign-up", "routes/sign-up.tsx"),
  route("confirm-email/:token", "routes/confirm-email.tsx"),
  route("forgot-password", "routes/forgot-password.tsx"),
  route("reset-password/:token", "routes/reset-password.tsx"),
  route("invitations/:token", "routes/invitation.tsx"),
  route("account", "routes/account.tsx"),
  route("predictions", "routes/predictions.tsx"),
  ...prefix("manuscripts", [
    index("routes/manuscripts.tsx"),
    route(":manuscriptId", "routes/manuscript.tsx"),
    route(":manuscriptId/members", "routes/manuscript-members.tsx"),
    route(":manuscriptId/audit", "routes/manuscript-audit.tsx"),
  ]),
  ...prefix("admin", [
    route("accounts", "routes/admin-accounts.tsx"),
    route("mail", "routes/admin-mail.tsx"),
  ]),
  ...prefix("api/v1", [
    route("manuscripts", "routes/api/manuscripts.ts"),
    route("manuscripts/:manuscriptId", "routes/api/manuscript.ts"),
    route("predictions", "routes/api/predictions.ts"),
    route("*", "routes/api/not-found.ts"),
  ]),
  route("healthz", "routes/healthz.ts"),
  route("*", "routes/not-found.tsx"),
] satisfies RouteConfig;
