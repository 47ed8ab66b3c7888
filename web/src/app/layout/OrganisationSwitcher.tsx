import { useId } from 'react';
import { Dropdown } from 'primereact/dropdown';
import type { CurrentUser } from '@stavemark/shared';
import { useNavigate } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useSwitchOrganisation } from '@/features/auth/api/switch-organisation';

/** Shown only to a person with memberships in more than one organisation. */
export function OrganisationSwitcher({ user }: { user: CurrentUser }) {
  const id = useId();
  const navigate = useNavigate();
  const switchOrganisation = useSwitchOrganisation();
  const options = user.memberships.map((m) => ({
    label: m.organisationName,
    value: m.organisationId,
  }));

  return (
    <div className="sm-org-switcher">
      <label htmlFor={id} className="sm-visually-hidden">
        Organisation
      </label>
      <Dropdown
        inputId={id}
        value={user.activeOrganisationId}
        options={options}
        disabled={switchOrganisation.isPending}
        onChange={(e) => {
          const organisationId = e.value as string;
          if (organisationId === user.activeOrganisationId) return;
          switchOrganisation.mutate(
            { organisationId },
            // The current page may not exist for the roles held in the other organisation.
            { onSuccess: () => navigate(paths.today.href()) },
          );
        }}
      />
    </div>
  );
}
