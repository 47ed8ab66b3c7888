import { useId } from 'react';
import { Checkbox } from 'primereact/checkbox';
import { ROLES, type Role } from '@stavemark/shared';
import { roleLabel } from '@/lib/format';
import { FieldError } from '@/components/FieldError';

interface Props {
  value: Role[];
  onChange: (roles: Role[]) => void;
  error?: string | undefined;
}

/** A group of role checkboxes; the roles are kept in ROLES order. */
export function RolesField({ value, onChange, error }: Props) {
  const id = useId();
  const toggle = (role: Role, on: boolean) =>
    onChange(ROLES.filter((r) => (r === role ? on : value.includes(r))));

  return (
    <fieldset className="sm-fieldset" aria-describedby={error ? `${id}-error` : undefined}>
      <legend>Roles</legend>
      <div className="sm-checks">
        {ROLES.map((role) => (
          <span key={role} className="sm-check">
            <Checkbox
              inputId={`${id}-${role}`}
              checked={value.includes(role)}
              onChange={(e) => toggle(role, !!e.checked)}
              invalid={!!error}
            />
            <label htmlFor={`${id}-${role}`}>{roleLabel(role)}</label>
          </span>
        ))}
      </div>
      <FieldError id={`${id}-error`} message={error} />
    </fieldset>
  );
}
