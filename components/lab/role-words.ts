import { roles, type Role } from '../../shared/terms/roles';

export const roleLabels: Record<Role, string> = {
  manager: 'Manager',
  technician: 'Technician',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
};

export const roleOptions = roles.map((value) => ({ value, label: roleLabels[value] }));
