import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { isApiError } from '@/lib/api-client';
import { PASSWORD_MIN_LENGTH } from '@shared/schemas/admin';
import type { User } from '@/types/api';
import { useChoosePassword, type LinkKind } from '@/features/invitations/api/submit-link-password';

/** Only what needs no server; the server's rules have the last word. */
export function checkNewPassword(password: string, repeated: string): { password?: string; repeated?: string } {
  if (password.trim().length < PASSWORD_MIN_LENGTH) return { password: `Use at least ${PASSWORD_MIN_LENGTH} characters; a few unrelated words make a good one.` };
  if (password !== repeated) return { repeated: 'The two passwords differ; type the same one twice.' };
  return {};
}

export interface ChoosePasswordFormProps {
  kind: LinkKind;
  token: string;
  email: string;
  submitLabel: string;
  onDone: (user: User) => void;
}

export function ChoosePasswordForm({ kind, token, email, submitLabel, onDone }: ChoosePasswordFormProps) {
  const [password, setPassword] = useState('');
  const [repeated, setRepeated] = useState('');
  const [local, setLocal] = useState<{ password?: string; repeated?: string }>({});
  const choose = useChoosePassword(kind, token, { onDone });
  const serverError = isApiError(choose.error) ? choose.error : null;

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const problems = checkNewPassword(password, repeated);
    setLocal(problems);
    if (problems.password || problems.repeated) return;
    choose.mutate(password);
  }

  const formMessage = choose.error && !serverError?.fields.password ? choose.error.message : null;
  return (
    <form noValidate onSubmit={submit} className="space-y-4">
      {/* Lets password managers file the new password under the right account. */}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      {formMessage ? (
        <p role="alert" className="rounded-sheet border border-nonconform/40 bg-nonconform-tint/70 px-3 py-2.5 text-small font-medium text-ink">
          {formMessage}
        </p>
      ) : null}
      <TextField
        label="New password"
        type="password"
        name="new-password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        autoFocus
        value={password}
        onChange={(event) => setPassword(event.target.value)}
        error={local.password ?? serverError?.fields.password}
        disabled={choose.isPending}
      />
      <TextField
        label="The same password again"
        type="password"
        name="repeat-password"
        autoComplete="new-password"
        value={repeated}
        onChange={(event) => setRepeated(event.target.value)}
        error={local.repeated}
        disabled={choose.isPending}
      />
      <Button type="submit" className="w-full" isBusy={choose.isPending}>
        {submitLabel}
      </Button>
    </form>
  );
}
