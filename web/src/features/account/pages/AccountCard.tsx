import type { ReactNode } from 'react';
import '../../classes/classes.css';

/** The frame of the public pages behind e-mailed links: the sign-in page's card, a little wider. */
export function AccountCard({ children }: { children: ReactNode }) {
  return (
    <main className="sm-signin">
      <div className="sm-signin-card sm-account-card">
        <p className="sm-wordmark">Stavemark</p>
        {children}
      </div>
    </main>
  );
}
