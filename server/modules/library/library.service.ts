// The package library: packages, aliases, nozzles, vision presets and machine profiles,
// with a revision row and an audit event for every edit and optimistic locking by version.
// This class is the library's one door for the router and the other services; the work is done by
//   packages.service.ts          packages (create, update, delete; checks; versions)
//   aliases.service.ts           aliases of packages
//   equipment.service.ts         nozzles, vision presets, machine profiles
//   library-transfer.service.ts  CSV bulk import, library file import and export
//   revision-log.ts              the revision rows and audit events of every edit
//   library-rows.ts              the whole library at once, the engine's LibraryFile made from it
//   library-dto.ts               the API's DTOs, revision snapshots, the version conflict
import type { DataSource, EntityManager } from 'typeorm';
import { PackageMatcher } from '../../../shared/library';
import type { LibraryFile } from '../../../shared/schemas/library-file.schema';
import type {
  AliasDto,
  AliasInput,
  CreatePackageInput,
  ImportResult,
  LibraryEntityKind,
  MachineInput,
  MatchResult,
  NozzleInput,
  PackageDto,
  PackageInput,
  RevisionDto,
  VisionPresetInput,
} from '../../../shared/schemas/library.schema';
import { LibraryPackage } from '../../db/entities/library-package.entity';
import type { FieldError } from '../../lib/errors';
import type { AuditActor, AuditService } from '../audit/audit.service';
import { AliasService } from './aliases.service';
import { EquipmentService } from './equipment.service';
import { getLibraryFile, resolveNowMatched } from './library-rows';
import { LibraryTransferService } from './library-transfer.service';
import { PackageService } from './packages.service';
import { RevisionLog } from './revision-log';

export { conflict, packageSnapshot } from './library-dto';
export { getLibraryFile, loadLibraryRows, resolveNowMatched } from './library-rows';

type Actor = AuditActor;
type Ip = string | null;

export class LibraryService {
  private readonly log: RevisionLog;
  private readonly packages: PackageService;
  private readonly aliases: AliasService;
  private readonly equipment: EquipmentService;
  private readonly transfer: LibraryTransferService;

  constructor(
    private readonly ds: DataSource,
    audit: AuditService,
  ) {
    this.log = new RevisionLog(ds, audit);
    this.aliases = new AliasService(ds, this.log);
    this.packages = new PackageService(ds, this.log, this.aliases);
    this.equipment = new EquipmentService(ds, this.log);
    this.transfer = new LibraryTransferService(ds, audit, this.log, this.packages, this.aliases);
  }

  // ------------------------------------------------------------ the whole library

  /** The engine's LibraryFile; the programs module calls this to run jobs. */
  getLibraryFile(manager?: EntityManager): Promise<LibraryFile> {
    return getLibraryFile(manager ?? this.ds.manager);
  }

  resolveOthers(m: EntityManager, by: string | null): Promise<number> {
    return resolveNowMatched(m, by);
  }

  async match(footprint: string): Promise<MatchResult> {
    const file = await this.getLibraryFile();
    const hit = new PackageMatcher(file.packages).match(footprint);
    let packageId: string | null = null;
    if (hit.pkg) packageId = (await this.ds.getRepository(LibraryPackage).findOneBy({ nameKey: hit.pkg.name.toLowerCase() }))?.id ?? null;
    return { footprint, packageId, packageName: hit.pkg?.name ?? null, matchedBy: hit.by };
  }

  // ------------------------------------------------------------ revisions

  revision(m: EntityManager, actor: Actor | null, entity: LibraryEntityKind, entityId: string | null, entityName: string, action: string, before: Record<string, unknown> | null, after: Record<string, unknown> | null, ip: Ip) {
    return this.log.record(m, actor, entity, entityId, entityName, action, before, after, ip);
  }
  revisions(q: { entity?: LibraryEntityKind; entityId?: string; limit: number }): Promise<RevisionDto[]> {
    return this.log.list(q);
  }

  // ------------------------------------------------------------ packages

  listPackages = (): Promise<PackageDto[]> => this.packages.listPackages();
  getPackage = (id: string, m?: EntityManager): Promise<PackageDto> => this.packages.getPackage(id, m);
  referenceErrors = (m: EntityManager, input: { nozzles: string[]; vision: string | null }, prefix?: string): Promise<FieldError[]> => this.packages.referenceErrors(m, input, prefix);
  createPackageIn = (m: EntityManager, input: CreatePackageInput, actor: Actor | null, ip: Ip): Promise<LibraryPackage> => this.packages.createPackageIn(m, input, actor, ip);
  createPackage = (input: CreatePackageInput, actor: Actor, ip: Ip): Promise<PackageDto> => this.packages.createPackage(input, actor, ip);
  updatePackageIn = (m: EntityManager, id: string, input: PackageInput & { version: number }, actor: Actor | null, ip: Ip): Promise<LibraryPackage> => this.packages.updatePackageIn(m, id, input, actor, ip);
  updatePackage = (id: string, input: PackageInput & { version: number }, actor: Actor, ip: Ip): Promise<PackageDto> => this.packages.updatePackage(id, input, actor, ip);
  deletePackage = (id: string, version: number, actor: Actor, ip: Ip): Promise<void> => this.packages.deletePackage(id, version, actor, ip);

  // ------------------------------------------------------------ aliases

  listAliases = (): Promise<AliasDto[]> => this.aliases.listAliases();
  createAliasIn = (m: EntityManager, input: AliasInput, actor: Actor | null, ip: Ip): Promise<AliasDto> => this.aliases.createAliasIn(m, input, actor, ip);
  createAlias = (input: AliasInput, actor: Actor, ip: Ip): Promise<AliasDto> => this.aliases.createAlias(input, actor, ip);
  updateAlias = (id: string, input: AliasInput & { version: number }, actor: Actor, ip: Ip): Promise<AliasDto> => this.aliases.updateAlias(id, input, actor, ip);
  deleteAlias = (id: string, version: number, actor: Actor, ip: Ip): Promise<void> => this.aliases.deleteAlias(id, version, actor, ip);

  // ------------------------------------------------------------ nozzles, vision presets, machines

  listNozzles = () => this.equipment.listNozzles();
  createNozzle = (i: NozzleInput, a: Actor, ip: Ip) => this.equipment.createNozzle(i, a, ip);
  updateNozzle = (id: string, i: NozzleInput & { version: number }, a: Actor, ip: Ip) => this.equipment.updateNozzle(id, i, a, ip);
  deleteNozzle = (id: string, v: number, a: Actor, ip: Ip) => this.equipment.deleteNozzle(id, v, a, ip);
  listPresets = () => this.equipment.listPresets();
  createPreset = (i: VisionPresetInput, a: Actor, ip: Ip) => this.equipment.createPreset(i, a, ip);
  updatePreset = (id: string, i: VisionPresetInput & { version: number }, a: Actor, ip: Ip) => this.equipment.updatePreset(id, i, a, ip);
  deletePreset = (id: string, v: number, a: Actor, ip: Ip) => this.equipment.deletePreset(id, v, a, ip);
  listMachines = () => this.equipment.listMachines();
  createMachine = (i: MachineInput, a: Actor, ip: Ip) => this.equipment.createMachine(i, a, ip);
  updateMachine = (id: string, i: MachineInput & { version: number }, a: Actor, ip: Ip) => this.equipment.updateMachine(id, i, a, ip);
  deleteMachine = (id: string, v: number, a: Actor, ip: Ip) => this.equipment.deleteMachine(id, v, a, ip);

  // ------------------------------------------------------------ CSV, library file

  exportText = (): Promise<string> => this.transfer.exportText();
  csvPreview = (text: string) => this.transfer.csvPreview(text);
  csvCommit = (text: string, actor: Actor, ip: Ip): Promise<{ created: number; updated: number }> => this.transfer.csvCommit(text, actor, ip);
  importLibrary = (file: unknown, mode: 'replace' | 'merge', actor: Actor, ip: Ip): Promise<ImportResult> => this.transfer.importLibrary(file, mode, actor, ip);
}
