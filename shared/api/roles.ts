import { z } from 'zod';

export const ROLES = ['inspector', 'qc_manager', 'engineer', 'admin', 'viewer'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const ROLE_LABELS: Record<Role, string> = {
  inspector: 'Yard inspector',
  qc_manager: 'QC manager',
  engineer: 'Plant engineer',
  admin: 'Administrator',
  viewer: 'Viewer',
};

/** Roles that may write readings, and other groups the API and the navigation share. */
export const CAN = {
  logReading: ['inspector', 'qc_manager', 'engineer', 'admin'] as Role[],
  readPlant: ['inspector', 'qc_manager', 'engineer', 'admin'] as Role[],
  predict: ['qc_manager', 'engineer', 'admin'] as Role[],
  manageUsers: ['admin'] as Role[],
};
