import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from 'primereact/button';
import { Dialog } from 'primereact/dialog';
import { Tag } from 'primereact/tag';
import { ApiError } from '@/lib/api-client';
import { Alert } from './Alert';
import { PageLoading } from './PageLoading';

export interface StarterEntry {
  key: string;
  title: string;
  details: string;
  /** Where the school's copy is, once added. */
  openHref: string | null;
}

/** A feature's part of the starter library, asked for only while the dialog is open. */
export type UseStarterEntries = (open: boolean) => {
  entries: StarterEntry[] | undefined;
  error: unknown;
};

/** Adding one entry: the key being added, the refusal if any. */
export type UseAddStarterEntry = () => {
  add: (key: string) => void;
  adding: string | null;
  error: unknown;
  reset: () => void;
};

interface Props {
  intro: string;
  useEntries: UseStarterEntries;
  useAdd: UseAddStarterEntry;
}

/**
 * "Add from the starter library" on a list page: the button, and a dialog of the library's
 * entries of that kind, each added to the school with one button or opened once it is there.
 */
export function AddFromStarterLibrary({ intro, useEntries, useAdd }: Props) {
  const [open, setOpen] = useState(false);
  const { entries, error: loadError } = useEntries(open);
  const { add, adding, error: addError, reset } = useAdd();
  const header = 'Add from the starter library';
  return (
    <>
      <Button
        type="button"
        icon="pi pi-book"
        label={header}
        severity="secondary"
        onClick={() => {
          reset();
          setOpen(true);
        }}
      />
      <Dialog
        header={header}
        visible={open}
        onHide={() => setOpen(false)}
        style={{ width: '40rem' }}
      >
        <p className="sm-muted">{intro}</p>
        {addError != null && (
          <Alert severity="error">
            {addError instanceof ApiError
              ? addError.message
              : 'The server could not be reached. Nothing was added; try again.'}
          </Alert>
        )}
        {loadError != null && (
          <Alert severity="error">
            Could not load the starter library.{' '}
            {loadError instanceof ApiError ? loadError.message : 'Check the connection.'}
          </Alert>
        )}
        {!entries && loadError == null && <PageLoading label="Loading the starter library…" />}
        {entries && (
          <ul className="sm-starter-list" aria-label={header}>
            {entries.map((e) => (
              <li key={e.key} aria-label={e.title}>
                <span className="sm-cell-stack">
                  <strong>{e.title}</strong>
                  <small className="sm-muted">{e.details}</small>
                </span>
                {e.openHref ? (
                  <span className="sm-row-actions">
                    <Tag value="In your school" severity="success" />
                    <Link to={e.openHref} onClick={() => setOpen(false)}>
                      Open
                    </Link>
                  </span>
                ) : (
                  <Button
                    type="button"
                    size="small"
                    icon="pi pi-plus"
                    label={adding === e.key ? 'Adding…' : 'Add'}
                    aria-label={`Add “${e.title}”`}
                    disabled={adding !== null}
                    onClick={() => add(e.key)}
                  />
                )}
              </li>
            ))}
          </ul>
        )}
      </Dialog>
    </>
  );
}
