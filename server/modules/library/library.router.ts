import type { Request } from 'express';
import { z } from 'zod';
import { uuidParamSchema } from '../../../shared/schemas/auth.schema';
import {
  addAliasFromUnmatchedInputSchema,
  aliasInputSchema,
  approveProposalInputSchema,
  createPackageInputSchema,
  csvInputSchema,
  deleteInputSchema,
  importInputSchema,
  machineInputSchema,
  matchQuerySchema,
  packageUsageSchema,
  nozzleInputSchema,
  proposalInputSchema,
  rejectProposalInputSchema,
  revisionQuerySchema,
  updateAliasInputSchema,
  updateMachineInputSchema,
  updateNozzleInputSchema,
  updatePackageInputSchema,
  updateVisionPresetInputSchema,
  visionPresetInputSchema,
} from '../../../shared/schemas/library.schema';
import { doc, type ApiRoutes } from '../../lib/routes';
import { validate } from '../../middleware/validate';
import type { AuditService } from '../audit/audit.service';
import { actorOf } from '../auth/auth.router';
import type { Mailer } from '../mail/mailer';
import type { UserService } from '../users/user.service';
import type { DataSource } from 'typeorm';
import { LibraryService } from './library.service';
import { packageUsage } from './package-usage.service';
import { ProposalService } from './proposals.service';
import { UnmatchedService } from './unmatched.service';

// Operators are not here: the run files and the set-up sheet carry every library value they need.
const READ = ['engineer', 'librarian'] as const;
const EDIT = ['librarian'] as const;
const PROPOSE = ['engineer', 'librarian'] as const;

export interface LibraryDeps {
  ds: DataSource;
  audit: AuditService;
  users: UserService;
  mailer: Mailer;
  publicUrl?: string;
}

const ip = (req: Request) => req.ip ?? null;
const id = (req: Request) => String(req.params.id);
const actorWithName = (req: Request) => ({ ...actorOf(req), name: req.user?.name });

/** The package library's routes. Returns the services for other modules. */
export function registerLibraryRoutes(api: ApiRoutes, deps: LibraryDeps) {
  const library = new LibraryService(deps.ds, deps.audit);
  const unmatched = new UnmatchedService(deps.ds, library);
  const proposals = new ProposalService(deps.ds, library, deps.audit, deps.users, deps.mailer, (deps.publicUrl ?? '').replace(/\/$/, ''));
  const params = validate(uuidParamSchema, 'params');

  // Packages
  api.get('/library/packages', READ, async (_req, res) => res.json({ items: await library.listPackages() }));
  api.post('/library/packages', EDIT, validate(createPackageInputSchema), async (req, res) => res.status(201).json(await library.createPackage(req.body, actorOf(req), ip(req))));
  api.get('/library/packages/:id', READ, params, async (req, res) => res.json(await library.getPackage(id(req))));
  // Which programs a package change reaches (shown before saving one): not for operators.
  const usageDoc = doc({ summary: 'The program revisions in work and released whose parts the package places', response: packageUsageSchema });
  api.get('/library/packages/:id/usage', ['librarian', 'engineer'], usageDoc, params, async (req, res) => res.json(await packageUsage(deps.ds, id(req))));
  api.put('/library/packages/:id', EDIT, params, validate(updatePackageInputSchema), async (req, res) => res.json(await library.updatePackage(id(req), req.body, actorOf(req), ip(req))));
  api.delete('/library/packages/:id', EDIT, params, validate(deleteInputSchema), async (req, res) => {
    await library.deletePackage(id(req), req.body.version, actorOf(req), ip(req));
    res.status(204).end();
  });
  api.post('/library/packages/csv/preview', EDIT, validate(csvInputSchema), async (req, res) => res.json(await library.csvPreview(req.body.csv)));
  api.post('/library/packages/csv', EDIT, validate(csvInputSchema), async (req, res) => res.status(201).json(await library.csvCommit(req.body.csv, actorOf(req), ip(req))));

  // Aliases
  api.get('/library/aliases', READ, async (_req, res) => res.json({ items: await library.listAliases() }));
  api.post('/library/aliases', EDIT, validate(aliasInputSchema), async (req, res) => res.status(201).json(await library.createAlias(req.body, actorOf(req), ip(req))));
  api.put('/library/aliases/:id', EDIT, params, validate(updateAliasInputSchema), async (req, res) => res.json(await library.updateAlias(id(req), req.body, actorOf(req), ip(req))));
  api.delete('/library/aliases/:id', EDIT, params, validate(deleteInputSchema), async (req, res) => {
    await library.deleteAlias(id(req), req.body.version, actorOf(req), ip(req));
    res.status(204).end();
  });

  // Nozzles, vision presets, machine profiles
  api.get('/library/nozzles', READ, async (_req, res) => res.json({ items: await library.listNozzles() }));
  api.post('/library/nozzles', EDIT, validate(nozzleInputSchema), async (req, res) => res.status(201).json(await library.createNozzle(req.body, actorOf(req), ip(req))));
  api.put('/library/nozzles/:id', EDIT, params, validate(updateNozzleInputSchema), async (req, res) => res.json(await library.updateNozzle(id(req), req.body, actorOf(req), ip(req))));
  api.delete('/library/nozzles/:id', EDIT, params, validate(deleteInputSchema), async (req, res) => {
    await library.deleteNozzle(id(req), req.body.version, actorOf(req), ip(req));
    res.status(204).end();
  });
  api.get('/library/vision-presets', READ, async (_req, res) => res.json({ items: await library.listPresets() }));
  api.post('/library/vision-presets', EDIT, validate(visionPresetInputSchema), async (req, res) => res.status(201).json(await library.createPreset(req.body, actorOf(req), ip(req))));
  api.put('/library/vision-presets/:id', EDIT, params, validate(updateVisionPresetInputSchema), async (req, res) => res.json(await library.updatePreset(id(req), req.body, actorOf(req), ip(req))));
  api.delete('/library/vision-presets/:id', EDIT, params, validate(deleteInputSchema), async (req, res) => {
    await library.deletePreset(id(req), req.body.version, actorOf(req), ip(req));
    res.status(204).end();
  });
  api.get('/library/machines', READ, async (_req, res) => res.json({ items: await library.listMachines() }));
  api.post('/library/machines', EDIT, validate(machineInputSchema), async (req, res) => res.status(201).json(await library.createMachine(req.body, actorOf(req), ip(req))));
  api.put('/library/machines/:id', EDIT, params, validate(updateMachineInputSchema), async (req, res) => res.json(await library.updateMachine(id(req), req.body, actorOf(req), ip(req))));
  api.delete('/library/machines/:id', EDIT, params, validate(deleteInputSchema), async (req, res) => {
    await library.deleteMachine(id(req), req.body.version, actorOf(req), ip(req));
    res.status(204).end();
  });

  // Revisions, matching, the whole library
  api.get('/library/revisions', READ, validate(revisionQuerySchema, 'query'), async (req, res) => res.json({ items: await library.revisions(req.query as unknown as z.infer<typeof revisionQuerySchema>) }));
  api.get('/library/match', READ, validate(matchQuerySchema, 'query'), async (req, res) => res.json(await library.match(String((req.query as { footprint: string }).footprint))));
  api.get('/library/file', READ, async (_req, res) => res.json(await library.getLibraryFile()));
  api.get('/library/export', READ, async (_req, res) => {
    const text = await library.exportText();
    const day = new Date().toISOString().slice(0, 10);
    res.type('application/json').set('Content-Disposition', `attachment; filename="placewright-library-${day}.json"`).send(text);
  });
  api.post('/library/import', EDIT, validate(importInputSchema), async (req, res) => res.json(await library.importLibrary(req.body.file, req.body.mode, actorOf(req), ip(req))));

  // Proposals
  api.get('/library/proposals', READ, async (_req, res) => res.json({ items: await proposals.list() }));
  api.post('/library/proposals', PROPOSE, validate(proposalInputSchema), async (req, res) => res.status(201).json(await proposals.create(req.body, actorWithName(req), ip(req))));
  api.post('/library/proposals/:id/approve', EDIT, params, validate(approveProposalInputSchema), async (req, res) => res.json(await proposals.decide(id(req), 'approve', req.body, actorOf(req), ip(req))));
  api.post('/library/proposals/:id/reject', EDIT, params, validate(rejectProposalInputSchema), async (req, res) => res.json(await proposals.decide(id(req), 'reject', req.body, actorOf(req), ip(req))));

  // Unmatched footprints
  api.get('/library/unmatched', READ, async (_req, res) => res.json({ items: await unmatched.list() }));
  api.post('/library/unmatched/:id/create-package', EDIT, params, validate(createPackageInputSchema), async (req, res) => res.status(201).json(await unmatched.createPackage(id(req), req.body, actorOf(req), ip(req))));
  api.post('/library/unmatched/:id/add-alias', EDIT, params, validate(addAliasFromUnmatchedInputSchema), async (req, res) => res.status(201).json(await unmatched.addAlias(id(req), req.body.packageId, req.body.pattern, actorOf(req), ip(req))));

  return { library, unmatched, proposals };
}
