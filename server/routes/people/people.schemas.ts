import { z } from 'zod';

export const listPeopleQuery = z.object({
  active: z
    .enum(['true', 'false'], { error: 'Field "active" must be true or false.' })
    .transform((value) => value === 'true')
    .optional(),
});

export type ListPeopleQuery = z.output<typeof listPeopleQuery>;
