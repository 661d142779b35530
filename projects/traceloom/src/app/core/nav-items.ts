import { PERMISSIONS, type Role } from '@traceloom/shared/api';

/** One entry of the side navigation. */
export interface NavItem {
  /** Used for the data-testid (`nav-<id>`). */
  id: string;
  label: string;
  icon: string;
  route: string;
  roles: readonly Role[];
}

const EVERYONE: readonly Role[] = PERMISSIONS.signedIn;

/**
 * Every destination of the side navigation, in display order. Later features (gases, runs,
 * datasets, review inbox, audit log, help) add their entries here with the roles that may use them.
 */
export const NAV_ITEMS: readonly NavItem[] = [
  { id: 'studies', label: 'Studies', icon: 'folder_open', route: '/studies', roles: EVERYONE },
  { id: 'datasets', label: 'Datasets', icon: 'inventory_2', route: '/datasets', roles: EVERYONE },
  {
    id: 'reviews',
    label: 'Review requests',
    icon: 'rate_review',
    route: '/reviews',
    roles: PERMISSIONS.review,
  },
  {
    id: 'audit',
    label: 'Audit log',
    icon: 'history',
    route: '/audit',
    roles: PERMISSIONS.readAudit,
  },
  {
    id: 'users',
    label: 'Users',
    icon: 'group',
    route: '/admin/users',
    roles: PERMISSIONS.administer,
  },
  {
    id: 'mailbox',
    label: 'Mailbox',
    icon: 'mail',
    route: '/admin/mailbox',
    roles: PERMISSIONS.administer,
  },
  { id: 'help', label: 'Guide', icon: 'menu_book', route: '/help', roles: EVERYONE },
];

/** The navigation entries a role may use. */
export function navItemsFor(role: Role | null): NavItem[] {
  return role ? NAV_ITEMS.filter((item) => item.roles.includes(role)) : [];
}
