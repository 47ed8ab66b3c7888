import type { ReactNode } from 'react';

interface Props {
  severity: 'error' | 'warn' | 'info' | 'success';
  children: ReactNode;
}

/**
 * A message in PrimeReact's message styling. Errors use role="alert" (read out at once);
 * other notices role="status" (read out politely).
 */
export function Alert({ severity, children }: Props) {
  return (
    <div
      role={severity === 'error' ? 'alert' : 'status'}
      className={`p-message p-component p-message-${severity} sm-alert`}
    >
      <div className="p-message-wrapper">
        <span className="p-message-text">{children}</span>
      </div>
    </div>
  );
}
