import type { Role } from '@stavemark/shared';
import { paths } from '@/config/paths';

export interface NavItem {
  to: string;
  label: string;
  roles: readonly Role[];
  /** Match the path exactly (the home page would otherwise match every path). */
  end?: boolean;
}

/** The navigation as data: a later feature adds its row here. Order is the order shown. */
export const navItems: readonly NavItem[] = [
  { to: paths.today.href(), label: 'Today', roles: paths.today.roles, end: true },
  { to: paths.people.href(), label: 'People', roles: paths.people.roles },
  { to: paths.rubrics.href(), label: 'Rubrics', roles: ['admin', 'teacher', 'examiner'] },
  {
    to: paths.requirementLists.href(),
    label: 'Requirement lists',
    roles: ['admin', 'teacher', 'examiner'],
  },
  { to: paths.classes.href(), label: 'Classes', roles: paths.classes.roles },
  { to: paths.sittings.href(), label: 'Sittings', roles: paths.sittings.roles },
  { to: paths.results.href(), label: 'Results', roles: paths.results.roles },
  { to: paths.attention.href(), label: 'Attention', roles: paths.attention.roles },
  { to: paths.myProgress.href(), label: 'Progress', roles: paths.myProgress.roles },
  { to: paths.outbox.href(), label: 'Outbox', roles: paths.outbox.roles },
  { to: paths.marking.href(), label: 'Marking', roles: paths.marking.roles },
  { to: paths.myResults.href(), label: 'My results', roles: paths.myResults.roles },
  { to: paths.agreement.href(), label: 'Agreement', roles: paths.agreement.roles },
  { to: paths.standardisation.href(), label: 'Standardisation', roles: paths.standardisation.roles },
  { to: paths.recordingSettings.href(), label: 'Recordings', roles: paths.recordingSettings.roles },
];

export function navItemsFor(roles: readonly Role[]): NavItem[] {
  return navItems.filter((item) => item.roles.some((r) => roles.includes(r)));
}
