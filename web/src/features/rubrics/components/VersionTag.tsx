import { Tag } from 'primereact/tag';
import type { VersionStatus } from '@stavemark/shared';

export function VersionTag({ version, status }: { version: number; status: VersionStatus }) {
  return (
    <Tag
      severity={status === 'published' ? 'success' : 'warning'}
      value={`Version ${version} · ${status === 'published' ? 'published' : 'draft'}`}
    />
  );
}
