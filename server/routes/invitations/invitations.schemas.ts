export {
  acceptInvitationBody,
  createInvitationBody,
  invitationIdParams,
  listInvitationsQuery,
  type AcceptInvitationBody,
  type CreateInvitationBody,
  type ListInvitationsQuery,
} from '../../../shared/schemas/admin';
