import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import type { Frame } from '../../../shared/schemas/frames';
import { FRAME_UPLOAD_FIELD } from '../../../shared/schemas/frames';
import type { SweepSetup } from '../../../shared/schemas/measurements';
import type { AppDeps } from '../../deps';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { actorOf } from '../../services/catalogue-queries';
import {
  discardStoredFrame,
  frameChangeRefusal,
  frameUploadSettingsFromEnv,
  loadSweepContext,
  storeFrameFromStream,
  type FrameUploadSettings,
} from '../../services/frame-storage';
import { deleteSweep, updateSweep } from '../../services/measurements';
import { setSweepReadings } from '../../services/readings';
import type { ReadingsInput, SweepIdParams } from './sweeps.schemas';

export function patchSweep(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { sweepId } = res.locals.params as SweepIdParams;
    const sweep = await updateSweep(deps.db, sweepId, res.locals.body as Partial<SweepSetup>, actorOf(req));
    res.status(HttpStatus.OK).json({ sweep });
  };
}

export function removeSweep(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { sweepId } = res.locals.params as SweepIdParams;
    await deleteSweep(deps, sweepId, actorOf(req));
    res.status(HttpStatus.NO_CONTENT).end();
  };
}

export function putReadings(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { sweepId } = res.locals.params as SweepIdParams;
    const frames = await setSweepReadings(deps.db, sweepId, res.locals.body as ReadingsInput, actorOf(req));
    res.status(HttpStatus.OK).json({ frames });
  };
}

/* -------------------------------- uploads --------------------------------- */

type StoredUpload = Partial<Express.Multer.File> & { frame?: Frame };

/** A multer storage engine that streams the file through storeFrameFromStream (never buffering it whole). */
function frameStorageEngine(deps: AppDeps, settings: FrameUploadSettings): multer.StorageEngine {
  return {
    _handleFile(req: Request, file, callback) {
      const actor = actorOf(req);
      storeFrameFromStream(deps, {
        sweepId: (req.params as { sweepId: string }).sweepId,
        fileName: file.originalname,
        stream: file.stream,
        settings,
        actorId: actor.actorId,
        ip: actor.ip,
      }).then(
        (frame) => callback(null, { frame, size: frame.byteSize } as StoredUpload),
        (error: unknown) => callback(error),
      );
    },
    _removeFile(req, file, callback) {
      const frame = (file as StoredUpload).frame;
      if (!frame) return callback(null);
      discardStoredFrame(deps, frame.id, actorOf(req)).then(
        () => callback(null),
        (error: unknown) => callback(error as Error),
      );
    },
  };
}

const requireMultipart: RequestHandler = (req, _res, next) => {
  if (!req.is('multipart/form-data')) {
    return next(
      new HttpError(
        HttpStatus.UNSUPPORTED_MEDIA_TYPE,
        `Send the frame as multipart/form-data, one image file in the field "${FRAME_UPLOAD_FIELD}".`,
      ),
    );
  }
  next();
};

/**
 * Refuses an unknown sweep, or one whose frames cannot change, before the
 * file is stored or decoded. The body is still read (and dropped) before the
 * answer goes out, as multer does on its errors: a browser that is cut off
 * mid-upload reports a network failure instead of the sentence.
 */
function checkSweepOpenForUploads(deps: AppDeps): RequestHandler {
  return async (req, res, next) => {
    const { sweepId } = res.locals.params as SweepIdParams;
    let refusal: HttpError | null = null;
    try {
      const context = await loadSweepContext(deps.db, sweepId);
      const sentence = frameChangeRefusal(context, 'uploading frames');
      if (sentence) refusal = new HttpError(HttpStatus.CONFLICT, sentence);
    } catch (error) {
      if (!(error instanceof HttpError)) throw error;
      refusal = error;
    }
    if (!refusal) return next();
    let answered = false;
    const answer = () => {
      if (answered) return;
      answered = true;
      next(refusal);
    };
    if (req.readableEnded || req.destroyed) return answer();
    req.once('end', answer).once('error', answer).once('close', answer);
    req.resume();
  };
}

/** POST /api/sweeps/:sweepId/frames: one image in the multipart field "frame", streamed to object storage. */
export function uploadFrameHandlers(deps: AppDeps): RequestHandler[] {
  const settings = frameUploadSettingsFromEnv(deps.env);
  const receive = multer({
    storage: frameStorageEngine(deps, settings),
    defParamCharset: 'utf8',
    limits: { files: 1, fields: 10, parts: 11, fieldSize: 10_000, headerPairs: 100 },
  }).single(FRAME_UPLOAD_FIELD);
  const receiveUnlessGone: RequestHandler = (req, res, next) => {
    receive(req, res, (error?: unknown) => {
      // A client that went away mid-upload is not a server fault; its frame was already cleaned up and nobody awaits an answer.
      if (error && (!req.socket || req.socket.destroyed)) {
        deps.log.info('A frame upload ended when its client went away.', { path: req.originalUrl });
        return;
      }
      if (error instanceof multer.MulterError && (error.code === 'LIMIT_FILE_COUNT' || (error.code === 'LIMIT_UNEXPECTED_FILE' && error.field === FRAME_UPLOAD_FIELD))) {
        const message = `Send one image per request in the field "${FRAME_UPLOAD_FIELD}"; this request carried more than one file, so none was kept.`;
        return next(new HttpError(HttpStatus.BAD_REQUEST, message, { [FRAME_UPLOAD_FIELD]: message }));
      }
      next(error);
    });
  };
  const respond: RequestHandler = (req, res) => {
    const frame = (req.file as StoredUpload | undefined)?.frame;
    if (!frame) {
      throw new HttpError(HttpStatus.BAD_REQUEST, `The upload holds no file in the field "${FRAME_UPLOAD_FIELD}".`, {
        [FRAME_UPLOAD_FIELD]: 'Choose an image file to upload.',
      });
    }
    res.status(HttpStatus.CREATED).json({ frame });
  };
  return [requireMultipart, checkSweepOpenForUploads(deps), receiveUnlessGone, respond];
}
