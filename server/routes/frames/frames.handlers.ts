import { pipeline } from 'node:stream/promises';
import type { RequestHandler } from 'express';
import type { FrameRendition } from '../../../shared/schemas/frames';
import type { AppDeps } from '../../deps';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import { FRAME_RENDITION_CONTENT_TYPE } from '../../services/frame-images';
import { frameRenditionKey } from '../../services/frame-storage';
import { deleteFrame, findFrame, setFrameExcluded } from '../../services/measurements';
import type { FrameIdParams, UpdateFrameBody } from './frames.schemas';

/** A frame's images never change under its id, so the browser may keep them; `private` because they are a client's data. */
const IMAGE_CACHE_CONTROL = 'private, max-age=31536000, immutable';

export function getFrameImage(deps: AppDeps, rendition: FrameRendition): RequestHandler {
  return async (req, res) => {
    const { frameId } = res.locals.params as FrameIdParams;
    const row = await findFrame(deps.db, frameId);
    const key = frameRenditionKey(row, rendition);
    if (!key) {
      if (rendition === 'original' && row.purgedAt) {
        throw new HttpError(
          HttpStatus.GONE,
          `The original of frame ${row.fileName} was removed by retention on ${row.purgedAt.toISOString().slice(0, 10)}; its thumbnail, preview and the analysis results remain.`,
        );
      }
      throw new HttpError(HttpStatus.NOT_FOUND, `Frame ${row.fileName} has no ${rendition}.`);
    }
    const etag = `"${row.sha256.slice(0, 40)}-${rendition}"`;
    res.setHeader('Cache-Control', IMAGE_CACHE_CONTROL);
    res.setHeader('ETag', etag);
    const asked = req.get('if-none-match');
    if (asked && asked.split(',').some((tag) => tag.trim().replace(/^W\//, '') === etag)) {
      res.status(304).end();
      return;
    }
    const stored = await deps.storage.getObjectStream(key);
    res.status(HttpStatus.OK);
    res.setHeader('Content-Type', rendition === 'original' ? row.contentType : FRAME_RENDITION_CONTENT_TYPE);
    if (stored.sizeBytes !== undefined) res.setHeader('Content-Length', String(stored.sizeBytes));
    if (rendition === 'original') res.setHeader('Content-Disposition', `inline; filename*=UTF-8''${encodeURIComponent(row.fileName)}`);
    try {
      await pipeline(stored.stream, res);
    } catch (error) {
      // The client went away mid-download, or storage broke off; headers are sent, so only the log can say.
      if (!res.writableFinished) deps.log.warn('A frame image download ended early.', { frameId, rendition, error });
    }
  };
}

export function patchFrame(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { frameId } = res.locals.params as FrameIdParams;
    const { excluded } = res.locals.body as UpdateFrameBody;
    res.status(HttpStatus.OK).json({ frame: await setFrameExcluded(deps.db, frameId, excluded, actorOf(req)) });
  };
}

export function removeFrame(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { frameId } = res.locals.params as FrameIdParams;
    await deleteFrame(deps, frameId, actorOf(req));
    res.status(HttpStatus.NO_CONTENT).end();
  };
}
