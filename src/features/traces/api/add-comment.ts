import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';
import { commentsKey, type TraceComment } from './get-comments.ts';

export async function addComment(traceId: string | number, text: string): Promise<TraceComment> {
  const { comment } = await api.post<{ comment: TraceComment }>(`/traces/${encodeURIComponent(String(traceId))}/comments`, { text });
  return comment;
}

export function useAddComment(traceId: string | number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (text: string) => addComment(traceId, text),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: commentsKey(traceId) }),
  });
}
