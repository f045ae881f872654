import { z } from 'zod';
import { listOrganisationsQuery as baseListOrganisationsQuery } from '../../../shared/schemas/work-orders';

export {
  contactIdParams,
  organisationIdParams,
  saveContactBody,
  saveOrganisationBody,
  type SaveContactBody,
  type SaveOrganisationBody,
} from '../../../shared/schemas/admin';

export const listOrganisationsQuery = baseListOrganisationsQuery.extend({
  include: z.enum(['counts'], { error: 'Field "include" must be "counts".' }).optional(),
});
export type ListOrganisationsQuery = z.output<typeof listOrganisationsQuery>;
