export { frameIdParams, updateFrameBody, type UpdateFrameBody } from '../../../shared/schemas/frames';

export interface FrameIdParams {
  frameId: string;
}
