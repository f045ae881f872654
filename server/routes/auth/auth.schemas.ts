import { z } from 'zod';

export const signInBody = z.object({
  email: z
    .string({ error: (issue) => (issue.input === undefined ? 'E-mail is required.' : 'E-mail must be text.') })
    .trim()
    .min(1, { error: 'E-mail is required.' })
    .pipe(z.email({ error: 'E-mail must be a valid address, like name@lab.example.' })),
  password: z
    .string({ error: (issue) => (issue.input === undefined ? 'Password is required.' : 'Password must be text.') })
    .min(1, { error: 'Password is required.' })
    .max(1024, { error: 'Password must be at most 1024 characters long.' }),
});

export type SignInBody = z.output<typeof signInBody>;
