import { useId, useRef } from 'react';
import { Button } from 'primereact/button';
import { RUBRIC_FILE_MAX_BYTES, type RubricVersionView } from '@stavemark/shared';
import { ApiError } from '@/lib/api-client';
import { useImportRubric } from '../api/import-rubric';

interface Props {
  onImported: (v: RubricVersionView) => void;
  onError: (message: string, details: { path: string; message: string }[]) => void;
}

/** Chooses a rubric file and uploads it; the API says where a file is wrong. */
export function ImportRubricButton({ onImported, onError }: Props) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const importRubric = useImportRubric();
  return (
    <>
      <input
        ref={input}
        id={`${id}-file`}
        type="file"
        accept=".json,application/json"
        className="sm-visually-hidden"
        aria-label="Rubric file to import"
        tabIndex={-1}
        onChange={(e) => {
          const file = e.target.files?.[0];
          e.target.value = ''; // the same file can be chosen again after fixing it
          if (!file) return;
          importRubric.mutate(file, {
            onSuccess: onImported,
            onError: (err) =>
              onError(
                err instanceof ApiError
                  ? err.message
                  : 'The server could not be reached. Nothing was imported.',
                err instanceof ApiError ? err.fieldErrors : [],
              ),
          });
        }}
      />
      <Button
        type="button"
        icon="pi pi-upload"
        label={importRubric.isPending ? 'Importing…' : 'Import a file'}
        severity="secondary"
        disabled={importRubric.isPending}
        tooltip={`A rubric file exported from Stavemark (JSON, at most ${RUBRIC_FILE_MAX_BYTES / 1024} kB)`}
        tooltipOptions={{ position: 'bottom' }}
        onClick={() => input.current?.click()}
      />
    </>
  );
}
