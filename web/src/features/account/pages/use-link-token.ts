import { useEffect, useState } from 'react';
import { useLocation } from 'react-router-dom';
import { tokenFromHash } from '../api/account-links';

/** Reads the token from the fragment once, then takes it out of the address bar and history. */
export function useLinkToken(): string {
  const location = useLocation();
  const [token] = useState(() => tokenFromHash(location.hash));
  useEffect(() => {
    if (window.location.hash)
      window.history.replaceState(window.history.state, '', window.location.pathname);
  }, []);
  return token;
}
