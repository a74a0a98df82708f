import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';

export type ShareInput = { to: string; message?: string /** Put a read-only report link valid this many days in the mail. */; linkDays?: number };
export type ShareResult = { sent: true; to: string; subject: string; link?: string };

/** E-mails the diagnosis (summary, contracts, findings, link) through the server's mailer. */
export async function shareTrace(traceId: string | number, input: ShareInput): Promise<ShareResult> {
  return api.post<ShareResult>(`/traces/${encodeURIComponent(String(traceId))}/share`, input);
}

export function useShareTrace(traceId: string | number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ShareInput) => shareTrace(traceId, input),
    // The mail is in the Outbox now.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['outbox'] }),
  });
}
