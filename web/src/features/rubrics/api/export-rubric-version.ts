import { useMutation } from '@tanstack/react-query';
import type { RubricFile } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';

export function exportRubricVersion(id: string): Promise<RubricFile> {
  return apiRequest<RubricFile>(`/rubric-versions/${encodeURIComponent(id)}/export`);
}

/** The file name the API also suggests: "scales-v2.rubric.json". */
export function rubricFileName(name: string, version: number): string {
  const slug =
    name
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'rubric';
  return `${slug}-v${version}.rubric.json`;
}

/** Saves the file in the browser (the route needs the bearer token, so a plain link cannot). */
function saveFile(file: RubricFile, fileName: string): void {
  const url = URL.createObjectURL(
    new Blob([`${JSON.stringify(file, null, 2)}\n`], { type: 'application/json' }),
  );
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  // Revoke later: some browsers start the download only after the click handler returns.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

export function useExportRubricVersion() {
  return useMutation({
    mutationFn: async ({ id, name, version }: { id: string; name: string; version: number }) => {
      const file = await exportRubricVersion(id);
      saveFile(file, rubricFileName(name, version));
      return file;
    },
  });
}
