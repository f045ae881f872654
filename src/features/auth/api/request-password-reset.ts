import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** "Forgot your password?": the answer is the same whether or not the address has an account. */
export async function requestPasswordReset(email: string): Promise<string> {
  const body = await api.post<{ message: string }>('/api/password-reset-requests', { email });
  return body.message;
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
