import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/lib/api-client';
import { useRequestPasswordReset } from '@/features/auth/api/request-password-reset';

/** Asks for a one-time password link by e-mail. */
export function ForgotPasswordForm({ onBack }: { onBack: () => void }) {
  const [email, setEmail] = useState('');
  const [localError, setLocalError] = useState<string | undefined>();
  const request = useRequestPasswordReset();
  const serverError = isApiError(request.error) ? request.error : null;

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (!/^[^\s@]+@[^\s@]+$/.test(email.trim())) {
      setLocalError('Enter an e-mail address like name@lab.example.');
      return;
    }
    setLocalError(undefined);
    request.mutate(email.trim());
  }

  if (request.isSuccess) {
    return (
      <div className="space-y-4">
        <p role="status" className="rounded-sheet border border-rule bg-sheet px-3 py-2.5 text-small text-ink">
          {request.data}
        </p>
        <Button variant="secondary" className="w-full" onClick={onBack}>
          Back to sign-in
        </Button>
      </div>
    );
  }
  return (
    <form noValidate onSubmit={submit} className="space-y-4" aria-label="Ask for a password link">
      <p className="text-small text-ink-soft">We send a link to choose a new password to the address your lab registered.</p>
      <TextField
        label="E-mail address"
        type="email"
        name="email"
        autoComplete="username"
        autoFocus
        value={email}
        onChange={(event) => setEmail(event.target.value)}
        error={localError ?? serverError?.fields.email ?? (serverError ? serverError.message : undefined)}
        disabled={request.isPending}
      />
      <Button type="submit" className="w-full" isBusy={request.isPending}>
        Send me a link
      </Button>
      <Button variant="quiet" className="w-full" onClick={onBack}>
        Back to sign-in
      </Button>
    </form>
  );
}
