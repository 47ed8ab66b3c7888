import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RecordedExamInput } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import { recordingsKey } from './get-slot-recordings';

export function setRecordedExam(sittingId: string, input: RecordedExamInput) {
  return apiRequest<{ sittingId: string; recordedExam: boolean }>(
    `/sittings/${encodeURIComponent(sittingId)}/recorded-exam`,
    { method: 'PUT', body: input },
  );
}

export function useSetRecordedExam() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ sittingId, recordedExam }: { sittingId: string; recordedExam: boolean }) =>
      setRecordedExam(sittingId, { recordedExam }),
    meta: { inlineErrors: true },
    // The sitting view carries the flag; each slot's panel says who may upload.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: recordingsKey }),
        queryClient.invalidateQueries({ queryKey: ['sittings'] }),
      ]),
  });
}
