import { useEffect, useId, useRef, useState } from 'react';
import { matchPath, NavLink, useLocation } from 'react-router-dom';
import type { NavGroupLabel, NavItem } from '../navigation';

/**
 * A menu of the bar (the disclosure pattern: a button that shows a list of links). It closes on
 * a choice, on Escape (focus back on the button) and on a click elsewhere, and reads as current
 * while one of its pages is open.
 */
export function NavMenu({ label, items }: { label: NavGroupLabel; items: readonly NavItem[] }) {
  const [open, setOpen] = useState(false);
  const listId = useId();
  const root = useRef<HTMLLIElement>(null);
  const button = useRef<HTMLButtonElement>(null);
  const { pathname } = useLocation();
  const current = items.some((i) => matchPath({ path: i.to, end: i.end ?? false }, pathname));

  // Another page (a link elsewhere, Back): closed. Adjusted during render, as React advises for state that follows a value.
  const [shownFor, setShownFor] = useState(pathname);
  if (shownFor !== pathname) {
    setShownFor(pathname);
    setOpen(false);
  }
  useEffect(() => {
    if (!open) return;
    const away = (e: MouseEvent) => {
      if (!root.current?.contains(e.target as Node)) setOpen(false);
    };
    const escape = (e: KeyboardEvent) => {
      if (e.key !== 'Escape') return;
      setOpen(false);
      button.current?.focus();
    };
    document.addEventListener('mousedown', away);
    document.addEventListener('keydown', escape);
    return () => {
      document.removeEventListener('mousedown', away);
      document.removeEventListener('keydown', escape);
    };
  }, [open]);

  return (
    <li ref={root} className="sm-bar-group">
      <button
        ref={button}
        type="button"
        className={current ? 'sm-bar-group-button active' : 'sm-bar-group-button'}
        aria-expanded={open}
        aria-controls={listId}
        onClick={() => setOpen((o) => !o)}
      >
        {label}
        <span className="pi pi-angle-down" aria-hidden="true" />
      </button>
      <ul id={listId} className="sm-bar-group-list" hidden={!open}>
        {items.map((item) => (
          <li key={item.to}>
            <NavLink to={item.to} end={item.end ?? false} onClick={() => setOpen(false)}>
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </li>
  );
}
