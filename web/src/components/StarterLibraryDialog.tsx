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

interface Props {
  visible: boolean;
  onHide: () => void;
  header: string;
  intro: string;
  entries: StarterEntry[] | undefined;
  loadError: unknown;
  /** The entry being added now, if any. */
  adding: string | null;
  addError: unknown;
  onAdd: (key: string) => void;
}

/** The starter library's entries of one kind, each added to the school with one button. */
export function StarterLibraryDialog(p: Props) {
  return (
    <Dialog header={p.header} visible={p.visible} onHide={p.onHide} style={{ width: '40rem' }}>
      <p className="sm-muted">{p.intro}</p>
      {p.addError != null && (
        <Alert severity="error">
          {p.addError instanceof ApiError
            ? p.addError.message
            : 'The server could not be reached. Nothing was added; try again.'}
        </Alert>
      )}
      {p.loadError != null && (
        <Alert severity="error">
          Could not load the starter library.{' '}
          {p.loadError instanceof ApiError ? p.loadError.message : 'Check the connection.'}
        </Alert>
      )}
      {!p.entries && p.loadError == null && <PageLoading label="Loading the starter library…" />}
      {p.entries && (
        <ul className="sm-starter-list" aria-label={p.header}>
          {p.entries.map((e) => (
            <li key={e.key} aria-label={e.title}>
              <span className="sm-cell-stack">
                <strong>{e.title}</strong>
                <small className="sm-muted">{e.details}</small>
              </span>
              {e.openHref ? (
                <span className="sm-row-actions">
                  <Tag value="In your school" severity="success" />
                  <Link to={e.openHref} onClick={p.onHide}>
                    Open
                  </Link>
                </span>
              ) : (
                <Button
                  type="button"
                  size="small"
                  icon="pi pi-plus"
                  label={p.adding === e.key ? 'Adding…' : 'Add'}
                  aria-label={`Add “${e.title}”`}
                  disabled={p.adding !== null}
                  onClick={() => p.onAdd(e.key)}
                />
              )}
            </li>
          ))}
        </ul>
      )}
    </Dialog>
  );
}
