import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { createHash } from 'node:crypto';
import { z } from 'zod';
import { uuidParamSchema } from '../../../shared/schemas/auth.schema';
import { importOptionsSchema } from '../../../shared/schemas/job.schema';
import {
  commentInputSchema,
  createProgramInputSchema,
  createTokenInputSchema,
  problemReportInputSchema,
  rejectInputSchema,
  reviewSummarySchema,
  reviewDecisionInputSchema,
  sideQuerySchema,
  underlayInputSchema,
  updateOverridesInputSchema,
  updateSettingsInputSchema,
  waiveInputSchema,
} from '../../../shared/schemas/program.schema';
import { BadRequestError, UnauthenticatedError } from '../../lib/errors';
import { doc, type ApiRoutes } from '../../lib/routes';
import { validate, zodIssues } from '../../middleware/validate';
import { PROGRAM_PAGE_MAX, UPLOAD_LIMIT_BYTES, type ProgramService, type ServiceUser } from './program.service';
import type { RunFileService } from './run-file.service';

const ACCEPTED_EXT = /\.(csv|txt|tsv|pos|xy|mnt|dat)$/i;
const ACCEPTED_TYPES = new Set(['text/csv', 'text/plain', 'text/tab-separated-values', 'application/csv', 'application/vnd.ms-excel', 'application/octet-stream']);

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: UPLOAD_LIMIT_BYTES, files: 1, fields: 10 },
  fileFilter: (_req, file, cb) => {
    if (ACCEPTED_EXT.test(file.originalname) || (ACCEPTED_TYPES.has(file.mimetype) && file.mimetype !== 'application/octet-stream')) return cb(null, true);
    cb(new BadRequestError(`${file.originalname} is not a CSV or text file. Export the centroid (pick-and-place) file from your CAD tool as CSV or text.`, [{ path: 'file', message: 'CSV or text files only' }]));
  },
});

/** The longest file name stored with a revision (the column is varchar(255), as most file systems allow). */
const FILE_NAME_MAX = 255;

/** Multipart: `file` plus `options` (JSON of the import options) and `version`. */
const uploadFields: RequestHandler = (req, res, next) => {
  upload.single('file')(req, res, (err: unknown) => {
    if (err) return next(err);
    if (!req.file) return next(new BadRequestError('Choose a centroid file to upload.', [{ path: 'file', message: 'Required' }]));
    if (req.file.originalname.length > FILE_NAME_MAX) {
      return next(new BadRequestError(`The file name is ${req.file.originalname.length} characters long; at most ${FILE_NAME_MAX} are kept. Rename the file and upload it again.`, [{ path: 'file', message: `File name longer than ${FILE_NAME_MAX} characters` }]));
    }
    let options: unknown = {};
    try {
      options = req.body?.options ? JSON.parse(String(req.body.options)) : {};
    } catch {
      return next(new BadRequestError('The import options are not valid JSON.', [{ path: 'options', message: 'Not JSON' }]));
    }
    const parsed = importOptionsSchema.safeParse(options);
    if (!parsed.success) return next(new BadRequestError('The import options are not valid.', zodIssues(parsed.error, 'options')));
    (req as Request & { importOptions: unknown }).importOptions = parsed.data;
    next();
  });
};

const versionField = z.coerce.number().int().min(1);

/** `?limit=&offset=` of the program list (most recently changed first). */
const programPageSchema = z.object({
  limit: z.coerce.number().int().min(1, 'At least 1').max(PROGRAM_PAGE_MAX, `At most ${PROGRAM_PAGE_MAX}`).default(PROGRAM_PAGE_MAX),
  offset: z.coerce.number().int().min(0, 'At least 0').default(0),
});

function userOf(req: Request): ServiceUser {
  if (!req.user) throw new UnauthenticatedError();
  return { id: req.user.id, email: req.user.email, roles: req.user.roles };
}

const ip = (req: Request) => req.ip ?? null;
const id = (req: Request) => String(req.params.id);

export function registerProgramRoutes(api: ApiRoutes, programs: ProgramService, runFiles: RunFileService) {
  const eng = ['engineer'] as const;

  api.get('/programs', eng, validate(programPageSchema, 'query'), async (req, res) => {
    res.json(await programs.listPrograms(req.query as unknown as z.infer<typeof programPageSchema>));
  });

  api.post('/programs', eng, validate(createProgramInputSchema), async (req, res) => {
    res.status(201).json(await programs.createProgram(req.body, userOf(req), ip(req)));
  });

  api.get('/programs/:id', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    res.json(await programs.getProgram(id(req)));
  });

  api.post('/programs/:id/revisions', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    res.status(201).json(await programs.newRevision(id(req), userOf(req), ip(req)));
  });

  api.get('/revisions/:id', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.post('/revisions/:id/centroid/preview', eng, validate(uuidParamSchema, 'params'), uploadFields, async (req, res) => {
    const opts = (req as Request & { importOptions: never }).importOptions;
    // A client that goes away (a closed page, a new file chosen) stops the reading in the worker.
    const gone = new AbortController();
    res.on('close', () => {
      if (!res.writableFinished) gone.abort();
    });
    res.json(await programs.previewImport(id(req), req.file!.buffer, req.file!.originalname, opts, gone.signal));
  });

  api.post('/revisions/:id/centroid', eng, validate(uuidParamSchema, 'params'), uploadFields, async (req, res) => {
    const version = versionField.safeParse(req.body?.version);
    if (!version.success) throw new BadRequestError('Send the revision version you saw.', [{ path: 'version', message: 'Required' }]);
    const opts = (req as Request & { importOptions: never }).importOptions;
    await programs.commitImport(id(req), req.file!.buffer, req.file!.originalname, opts, version.data, userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.put('/revisions/:id/settings', eng, validate(uuidParamSchema, 'params'), validate(updateSettingsInputSchema), async (req, res) => {
    await programs.updateSettings(id(req), req.body.settings, req.body.version, userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.put('/revisions/:id/overrides', eng, validate(uuidParamSchema, 'params'), validate(updateOverridesInputSchema), async (req, res) => {
    await programs.updateOverrides(id(req), req.body.overrides, req.body.version, userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.get('/revisions/:id/run', eng, validate(uuidParamSchema, 'params'), validate(sideQuerySchema, 'query'), async (req, res) => {
    res.json(await programs.run(id(req), (req.query as unknown as { side: 'top' | 'bottom' }).side));
  });

  api.post('/revisions/:id/checks', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    await programs.check(id(req), userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.post('/revisions/:id/waivers', eng, validate(uuidParamSchema, 'params'), validate(waiveInputSchema), async (req, res) => {
    res.status(201).json(await programs.waive(id(req), req.body.key, req.body.reason, userOf(req), ip(req), req.body.scope));
  });

  const reviewSummaryDoc = doc({ summary: 'What a reviewer approves: findings by kind with their waivers, the overrides, the changes since the last release', response: reviewSummarySchema });
  api.get('/revisions/:id/review-summary', eng, reviewSummaryDoc, validate(uuidParamSchema, 'params'), async (req, res) => {
    res.json(await programs.reviewSummary(id(req)));
  });

  api.delete('/revisions/:id/waivers/:waiverId', eng, validate(z.object({ id: z.string().uuid(), waiverId: z.string().uuid() }), 'params'), async (req, res) => {
    await programs.unwaive(id(req), String(req.params.waiverId), userOf(req), ip(req));
    res.status(204).end();
  });

  api.post('/revisions/:id/submit', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    await programs.submit(id(req), userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.post('/revisions/:id/approve', eng, validate(uuidParamSchema, 'params'), validate(reviewDecisionInputSchema), async (req, res) => {
    await programs.approve(id(req), req.body.comment, userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.post('/revisions/:id/reject', eng, validate(uuidParamSchema, 'params'), validate(rejectInputSchema), async (req, res) => {
    await programs.reject(id(req), req.body.comment, userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.post('/revisions/:id/withdraw', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    await programs.withdraw(id(req), userOf(req), ip(req));
    res.json(await programs.getRevision(id(req), userOf(req)));
  });

  api.post('/revisions/:id/comments', eng, validate(uuidParamSchema, 'params'), validate(commentInputSchema), async (req, res) => {
    res.status(201).json(await programs.addComment(id(req), req.body, userOf(req), ip(req)));
  });

  api.get('/revisions/:id/underlay', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    res.json(await programs.getUnderlays(id(req)));
  });

  api.put('/revisions/:id/underlay', eng, validate(uuidParamSchema, 'params'), validate(underlayInputSchema), async (req, res) => {
    await programs.setUnderlay(id(req), req.body.side, req.body.underlay, userOf(req), ip(req));
    res.status(204).end();
  });

  // ---- run files (operators; line computers with a token may download) --------------------
  api.get('/run-files', ['operator', 'engineer'], async (_req, res) => {
    res.json({ items: await runFiles.list() });
  });

  // Before /run-files/:id/:file, which would otherwise take `setup-sheet` as a file name.
  api.get('/run-files/:id/setup-sheet', ['operator', 'engineer'], validate(uuidParamSchema, 'params'), async (req, res) => {
    res.json(await runFiles.setupSheet(id(req)));
  });

  const fileParams = z.object({ id: z.string().uuid('Not a valid id'), file: z.string().regex(/^(top|bottom)\.(csv|json)$/, 'top.csv, top.json, bottom.csv or bottom.json') });
  api.get('/run-files/:id/:file', ['operator', 'engineer', 'line-token'], validate(fileParams, 'params'), async (req: Request, res: Response, _next: NextFunction) => {
    const [side, format] = String(req.params.file).split('.');
    const { file, name } = await runFiles.file(id(req), side, format);
    res.setHeader('Content-Type', format === 'csv' ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${name}"`);
    // The list's own digest (shared/placement-list/README.md: CSV — every byte after the metadata lines), and
    // the digest of the whole file as sent, for tools like sha256sum.
    res.setHeader('X-Content-SHA256', file.sha256);
    res.setHeader('X-File-SHA256', createHash('sha256').update(file.bytes).digest('hex'));
    res.setHeader('Cache-Control', 'no-store');
    res.send(file.bytes);
  });

  api.post('/run-files/:id/problems', ['operator', 'engineer'], validate(uuidParamSchema, 'params'), validate(problemReportInputSchema), async (req, res) => {
    await runFiles.reportProblem(id(req), req.body.text, userOf(req), ip(req));
    res.status(201).json({ ok: true });
  });

  // ---- API tokens ---------------------------------------------------------------------------
  api.get('/tokens', eng, async (_req, res) => {
    res.json({ items: await runFiles.listTokens() });
  });

  api.post('/tokens', eng, validate(createTokenInputSchema), async (req, res) => {
    res.status(201).json(await runFiles.createToken(req.body.name, userOf(req), ip(req)));
  });

  api.delete('/tokens/:id', eng, validate(uuidParamSchema, 'params'), async (req, res) => {
    await runFiles.revokeToken(id(req), userOf(req), ip(req));
    res.status(204).end();
  });
}
