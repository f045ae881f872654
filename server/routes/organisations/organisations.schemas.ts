export { listOrganisationsQuery, type ListOrganisationsQuery } from '../../../shared/schemas/work-orders';
