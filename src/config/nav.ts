import type { NavItem } from '@/components/layouts/app-shell';
import { paths } from './paths';

// The main navigation; each entry names the roles that see it.
export const navItems: NavItem[] = [
  { to: paths.home, label: 'Home' },
  { to: paths.events, label: 'Events', roles: ['director', 'organiser', 'admin'] },
  { to: paths.faultLocator, label: 'Fault locator' },
  { to: paths.equipment, label: 'Equipment' },
  { to: paths.profiles, label: 'Limit profiles', roles: ['admin', 'director', 'organiser'] },
  { to: paths.people, label: 'People', roles: ['admin'] },
  { to: paths.outbox, label: 'Outbox', roles: ['admin'] },
];
