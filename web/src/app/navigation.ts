import type { Role } from '@stavemark/shared';
import { paths } from '@/config/paths';

export interface NavItem {
  to: string;
  label: string;
  roles: readonly Role[];
  /** Match the path exactly (the home page would otherwise match every path). */
  end?: boolean;
  /** Shown inside this menu of the bar rather than on it, so the bar fits one row at 1280 px. */
  group?: NavGroupLabel;
}

/** Menus of the bar, in the order of their first row. */
export type NavGroupLabel = 'Syllabus' | 'Marking quality' | 'School';

export type NavEntry = { kind: 'link'; item: NavItem } | { kind: 'group'; label: NavGroupLabel; items: NavItem[] };

/** The navigation as data: a later feature adds its row here. Order is the order shown. */
export const navItems: readonly NavItem[] = [
  { to: paths.today.href(), label: 'Today', roles: paths.today.roles, end: true },
  { to: paths.people.href(), label: 'People', roles: paths.people.roles },
  { to: paths.rubrics.href(), label: 'Rubrics', roles: ['admin', 'teacher', 'examiner'], group: 'Syllabus' },
  {
    to: paths.requirementLists.href(),
    label: 'Requirement lists',
    roles: ['admin', 'teacher', 'examiner'],
    group: 'Syllabus',
  },
  { to: paths.classes.href(), label: 'Classes', roles: paths.classes.roles },
  { to: paths.sittings.href(), label: 'Sittings', roles: paths.sittings.roles },
  { to: paths.results.href(), label: 'Results', roles: paths.results.roles },
  { to: paths.attention.href(), label: 'Attention', roles: paths.attention.roles },
  { to: paths.myProgress.href(), label: 'Progress', roles: paths.myProgress.roles },
  { to: paths.marking.href(), label: 'Marking', roles: paths.marking.roles },
  { to: paths.myResults.href(), label: 'My results', roles: paths.myResults.roles },
  { to: paths.agreement.href(), label: 'Agreement', roles: paths.agreement.roles, group: 'Marking quality' },
  { to: paths.standardisation.href(), label: 'Standardisation', roles: paths.standardisation.roles, group: 'Marking quality' },
  { to: paths.outbox.href(), label: 'Outbox', roles: paths.outbox.roles, group: 'School' },
  { to: paths.bandPolicy.href(), label: 'Band policy', roles: paths.bandPolicy.roles, group: 'School' },
  { to: paths.recordingSettings.href(), label: 'Recordings', roles: paths.recordingSettings.roles, group: 'School' },
];

export function navItemsFor(roles: readonly Role[]): NavItem[] {
  return navItems.filter((item) => item.roles.some((r) => roles.includes(r)));
}

/**
 * What the bar shows for these roles: links, and menus at the place of their first member. A menu
 * with one member for the role is shown as that link.
 */
export function navEntriesFor(roles: readonly Role[]): NavEntry[] {
  const items = navItemsFor(roles);
  const entries: NavEntry[] = [];
  for (const item of items) {
    if (!item.group) {
      entries.push({ kind: 'link', item });
      continue;
    }
    if (entries.some((e) => e.kind === 'group' && e.label === item.group)) continue;
    const members = items.filter((i) => i.group === item.group);
    entries.push(members.length > 1 ? { kind: 'group', label: item.group, items: members } : { kind: 'link', item });
  }
  return entries;
}
