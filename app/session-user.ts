/** The signed-in user as loaders hand it to components. */
export type SessionUser = {
  id: string;
  email: string;
  name: string;
  siteRole: "member" | "admin";
  isDemo: boolean;
};
