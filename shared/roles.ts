/** The four roles a Luxtrail user can hold inside one organisation. */
export const ROLES = ['admin', 'surveyor', 'calibration', 'facility_manager'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  surveyor: 'Surveyor',
  calibration: 'Calibration',
  facility_manager: 'Facility manager',
};
