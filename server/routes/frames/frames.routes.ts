import { frameRenditions } from '../../../shared/schemas/frames';
import { validateBody, validateParams } from '../../middleware/validate';
import type { RouteDefinition } from '../route-definition';
import { getFrameImage, patchFrame, removeFrame } from './frames.handlers';
import { frameIdParams, updateFrameBody } from './frames.schemas';

const RENDITION_SUMMARIES = {
  thumbnail: 'A frame\'s thumbnail (JPEG, at most 320 px).',
  preview: 'A frame\'s preview (JPEG, at most 1600 px; 16-bit frames stretched for display).',
  original: 'A frame\'s original file, as uploaded.',
} as const;

export const frameRoutes: RouteDefinition[] = [
  ...frameRenditions.map(
    (rendition): RouteDefinition => ({
      method: 'get',
      path: `/api/frames/:frameId/${rendition}`,
      roles: ['technician', 'reviewer', 'admin'],
      summary: RENDITION_SUMMARIES[rendition],
      handlers: (deps) => [validateParams(frameIdParams), getFrameImage(deps, rendition)],
    }),
  ),
  {
    method: 'patch',
    path: '/api/frames/:frameId',
    roles: ['technician'],
    summary: 'Excludes a frame from (or includes it in) the next analysis run.',
    handlers: (deps) => [validateParams(frameIdParams), validateBody(updateFrameBody), patchFrame(deps)],
  },
  {
    method: 'delete',
    path: '/api/frames/:frameId',
    roles: ['technician'],
    summary: 'Deletes a frame and its images; only before any analysis of the measurement.',
    handlers: (deps) => [validateParams(frameIdParams), removeFrame(deps)],
  },
];
