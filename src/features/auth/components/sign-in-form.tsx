import { useEffect, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/text-field';
import { SquareCrossGlyph } from '@/components/ui/mark-glyphs';
import { describeWait, isApiError } from '@/lib/api-client';
import type { User } from '@/types/api';
import { useSignIn } from '@/features/auth/api/sign-in';

export interface DemoAccount {
  label: string;
  email: string;
  password: string;
}

export interface SignInFormProps {
  onSignedIn: (user: User) => void;
  /** Shown as one-click fill-ins; pass only in development builds. */
  demoAccounts?: DemoAccount[];
}

interface FieldErrors {
  email?: string;
  password?: string;
}

/** Client-side checks only catch what needs no server; the server's answer has the last word. */
export function checkSignInFields(email: string, password: string): FieldErrors {
  const errors: FieldErrors = {};
  if (email.trim() === '') errors.email = 'Enter your e-mail address.';
  else if (!/^[^\s@]+@[^\s@]+$/.test(email.trim())) errors.email = 'Enter an e-mail address like name@lab.example.';
  if (password === '') errors.password = 'Enter your password.';
  return errors;
}

export function SignInForm({ onSignedIn, demoAccounts }: SignInFormProps) {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [localErrors, setLocalErrors] = useState<FieldErrors>({});
  const [lockedUntilMs, setLockedUntilMs] = useState<number | null>(null);
  const [nowMs, setNowMs] = useState(() => Date.now());
  const emailRef = useRef<HTMLInputElement>(null);
  const passwordRef = useRef<HTMLInputElement>(null);
  const signIn = useSignIn({ onSignedIn });

  const serverError = isApiError(signIn.error) ? signIn.error : null;
  const unexpectedError = signIn.error && !serverError ? signIn.error : null;
  const fieldErrors: FieldErrors = {
    email: localErrors.email ?? serverError?.fields.email,
    password: localErrors.password ?? serverError?.fields.password,
  };

  useEffect(() => {
    if (serverError?.status === 429) {
      setLockedUntilMs(Date.now() + (serverError.retryAfterSeconds ?? 60) * 1000);
    }
  }, [serverError]);

  useEffect(() => {
    if (lockedUntilMs === null) return;
    const timer = window.setInterval(() => {
      const now = Date.now();
      setNowMs(now);
      if (now >= lockedUntilMs) setLockedUntilMs(null);
    }, 1000);
    return () => window.clearInterval(timer);
  }, [lockedUntilMs]);

  const secondsLeft = lockedUntilMs === null ? 0 : Math.max(0, Math.ceil((lockedUntilMs - nowMs) / 1000));

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (signIn.isPending || lockedUntilMs !== null) return;
    const errors = checkSignInFields(email, password);
    setLocalErrors(errors);
    if (errors.email) {
      emailRef.current?.focus();
      return;
    }
    if (errors.password) {
      passwordRef.current?.focus();
      return;
    }
    signIn.mutate({ email: email.trim(), password });
  }

  function fillDemo(account: DemoAccount) {
    setEmail(account.email);
    setPassword(account.password);
    setLocalErrors({});
    signIn.reset();
  }

  const formMessage =
    serverError && !(serverError.status === 400 && Object.keys(serverError.fields).length > 0)
      ? serverError.message
      : unexpectedError
        ? 'Something unexpected went wrong while signing in. Try again; if it happens again, tell your administrator.'
        : null;

  return (
    <div className="space-y-6">
      <form noValidate onSubmit={submit} className="space-y-4" aria-describedby={formMessage ? 'sign-in-problem' : undefined}>
        <div id="sign-in-problem" role="alert" aria-atomic="true">
          {formMessage ? (
            <div className="flex gap-2.5 rounded-sheet border border-nonconform/40 bg-nonconform-tint/70 px-3 py-2.5 text-small">
              <SquareCrossGlyph className="mt-0.5 size-4 shrink-0 text-nonconform" />
              <div>
                <p className="font-medium text-ink">{formMessage}</p>
                {serverError?.status === 429 && secondsLeft > 0 ? (
                  <p className="mt-0.5 text-ink-soft">
                    The form unlocks in {describeWait(secondsLeft)}.
                  </p>
                ) : null}
              </div>
            </div>
          ) : null}
          {localErrors.email || localErrors.password ? (
            <p className="sr-only">
              Sign-in not sent. {[localErrors.email, localErrors.password].filter(Boolean).join(' ')}
            </p>
          ) : null}
        </div>

        <TextField
          ref={emailRef}
          label="E-mail address"
          name="email"
          type="email"
          inputMode="email"
          autoComplete="username"
          autoCapitalize="none"
          spellCheck={false}
          autoFocus
          value={email}
          onChange={(event) => {
            setEmail(event.target.value);
            if (localErrors.email) setLocalErrors((errors) => ({ ...errors, email: undefined }));
          }}
          error={fieldErrors.email}
          disabled={signIn.isPending}
        />
        <TextField
          ref={passwordRef}
          label="Password"
          name="password"
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(event) => {
            setPassword(event.target.value);
            if (localErrors.password) setLocalErrors((errors) => ({ ...errors, password: undefined }));
          }}
          error={fieldErrors.password}
          disabled={signIn.isPending}
        />
        <Button type="submit" className="w-full" isBusy={signIn.isPending} disabled={lockedUntilMs !== null}>
          {signIn.isPending ? 'Signing in…' : lockedUntilMs !== null ? `Wait ${describeWait(secondsLeft)}` : 'Sign in'}
        </Button>
      </form>

      {demoAccounts && demoAccounts.length > 0 ? (
        <details className="rounded-sheet border border-dashed border-rule-strong px-3 py-2 text-small">
          <summary className="cursor-pointer font-medium text-ink-soft">Demo sign-ins (development build only)</summary>
          <ul className="mt-2 space-y-1">
            {demoAccounts.map((account) => (
              <li key={account.email}>
                <button
                  type="button"
                  onClick={() => fillDemo(account)}
                  className="flex w-full items-baseline justify-between gap-3 rounded-hair px-1.5 py-1 text-left hover:bg-shade"
                >
                  <span className="font-medium text-ink">{account.label}</span>
                  <span className="numerals text-caption text-ink-faint">{account.email}</span>
                </button>
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
