/** Lab roles and what each may do: plain words and lists, no zod (the web app's first load). */
export const roles = ['manager', 'technician', 'reviewer', 'viewer'] as const;
export type Role = (typeof roles)[number];

/** What each role may do, in the words the app shows. */
export const roleSummaries: Record<Role, string> = {
  manager: 'Runs the lab: members, invitations, settings and criteria, plus everything below.',
  technician: 'Writes recipes, prepares batches, runs burn tests and submits them for review.',
  reviewer: 'Signs off or returns submitted burn tests, and corrects signed ones with a reason.',
  viewer: 'Reads everything in the lab and downloads reports; changes nothing.',
};

/** The capabilities a route can require; a role holds the ones listed for it. */
export const capabilities = ['read', 'edit', 'review', 'manage'] as const;
export type Capability = (typeof capabilities)[number];

const granted: Record<Role, readonly Capability[]> = {
  manager: ['read', 'edit', 'review', 'manage'],
  technician: ['read', 'edit'],
  reviewer: ['read', 'review'],
  viewer: ['read'],
};

export function roleCan(role: Role, capability: Capability): boolean {
  return granted[role].includes(capability);
}

export const unitSystems = ['metric', 'us'] as const;
export type UnitSystem = (typeof unitSystems)[number];
