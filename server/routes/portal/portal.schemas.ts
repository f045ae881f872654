export { portalOrdersQuery, workRequestBody, type PortalOrdersQuery, type WorkRequestInput } from '../../../shared/schemas/portal';
