/** What later seed steps need from the first: the organisations and users it made. */
export type SeedContext = {
  now: number;
  demoOrgId: number;
  otherOrgId: number;
  usersByEmail: Record<string, number>;
};
