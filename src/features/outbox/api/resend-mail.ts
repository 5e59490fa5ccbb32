import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getUndeliveredMailQueryOptions } from './get-undelivered-mail';

export function resendMail(mailId: number): Promise<void> {
  return api.post<void>(`/api/mail/messages/${mailId}/resend`);
}

export function useResendMail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendMail,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getUndeliveredMailQueryOptions().queryKey }),
  });
}
