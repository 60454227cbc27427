import { createContext, useContext, type ReactNode } from 'react';
import type { LabMembership, Me } from '../shared/schemas/auth';
import { roleCan, type Capability } from '../shared/terms/roles';

type LabContextValue = { lab: LabMembership; me: Me };

const LabContext = createContext<LabContextValue | undefined>(undefined);

export function LabProvider({ value, children }: { value: LabContextValue; children: ReactNode }) {
  return <LabContext.Provider value={value}>{children}</LabContext.Provider>;
}

/** The lab the screen is in, the caller's role there, and who the caller is. */
export function useLab(): LabContextValue & { can: (capability: Capability) => boolean } {
  const value = useContext(LabContext);
  if (!value) throw new Error('useLab outside a lab screen');
  return { ...value, can: (capability) => roleCan(value.lab.role, capability) };
}
