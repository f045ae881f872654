export {
  changeRolesBody,
  completePasswordResetBody,
  listPeopleQuery,
  personIdParams,
  requestPasswordResetBody,
  type ChangeRolesBody,
  type CompletePasswordResetBody,
  type ListPeopleQuery,
  type RequestPasswordResetBody,
} from '../../../shared/schemas/admin';
