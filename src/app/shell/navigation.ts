import { Role } from '../core/user';

/** One entry in the side navigation. */
export interface NavItem {
  readonly label: string;
  readonly path: string;
  /** Material Icons ligature name. */
  readonly icon: string;
}

/** Each role's areas, in the order a person of that role works through them. */
export const NAVIGATION: Readonly<Record<Role, readonly NavItem[]>> = {
  teacher: [
    { label: 'Rule cards', path: '/rule-cards', icon: 'style' },
    { label: 'Gallery', path: '/gallery', icon: 'collections_bookmark' },
    { label: 'Drills', path: '/drills', icon: 'queue_music' },
    { label: 'Worksheets', path: '/worksheets', icon: 'description' },
    { label: 'Import groove', path: '/imports', icon: 'upload_file' },
    { label: 'Studio', path: '/studio', icon: 'groups' },
    { label: 'Print settings', path: '/print-settings', icon: 'print' },
  ],
  student: [
    { label: 'Assignments', path: '/assignments', icon: 'assignment' },
    { label: 'Practice', path: '/practice', icon: 'timer' },
    { label: 'Gallery', path: '/gallery', icon: 'collections_bookmark' },
  ],
  admin: [
    { label: 'Presets', path: '/presets', icon: 'library_music' },
    { label: 'Users', path: '/admin/users', icon: 'manage_accounts' },
  ],
};

/** The navigation for a role; nothing for a signed-out visitor. */
export function navigationFor(role: Role | null): readonly NavItem[] {
  return role ? NAVIGATION[role] : [];
}
