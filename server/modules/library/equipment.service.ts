// Nozzles, vision presets and machine profiles: named things of the library that packages and
// machines refer to by name. One set of list / create / update / delete for the three kinds; a
// rename carries over to what refers to the old name, a delete is refused while anything does.
import type { DataSource, EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import type {
  LibraryEntityKind,
  MachineDto,
  MachineInput,
  NozzleDto,
  NozzleInput,
  VisionPresetDto,
  VisionPresetInput,
} from '../../../shared/schemas/library.schema';
import { LibraryMachine } from '../../db/entities/library-machine.entity';
import { LibraryNozzle } from '../../db/entities/library-nozzle.entity';
import { LibraryVisionPreset } from '../../db/entities/library-vision-preset.entity';
import { ConflictError, NotFoundError, ValidationError } from '../../lib/errors';
import type { AuditActor } from '../audit/audit.service';
import { conflict, toMachineDto, toNozzleDto, toPresetDto } from './library-dto';
import type { RevisionLog } from './revision-log';

/** A library row known by its name. */
export type Named = ObjectLiteral & { id: string; name: string; version: number; updatedBy: string | null };

interface NamedKind<E extends Named, I, D> {
  entity: Exclude<LibraryEntityKind, 'package' | 'alias' | 'library'>;
  cls: EntityTarget<E>;
  what: string;
  toDto(e: E): D;
  snapshot(e: E): Record<string, unknown>;
  assign(e: E, input: I): void;
}

const NOZZLE: NamedKind<LibraryNozzle, NozzleInput, NozzleDto> = {
  entity: 'nozzle', cls: LibraryNozzle, what: 'Nozzle', toDto: toNozzleDto,
  snapshot: (n) => ({ name: n.name, tipOuter: n.tipOuter, tipInner: n.tipInner, holderRadius: n.holderRadius, notes: n.notes, version: n.version }),
  assign: (n, i) => Object.assign(n, { name: i.name, tipOuter: i.tipOuter, tipInner: i.tipInner, holderRadius: i.holderRadius, notes: i.notes }),
};
const PRESET: NamedKind<LibraryVisionPreset, VisionPresetInput, VisionPresetDto> = {
  entity: 'vision-preset', cls: LibraryVisionPreset, what: 'Vision preset', toDto: toPresetDto,
  snapshot: (v) => ({ name: v.name, method: v.method, lighting: v.lighting, sizeTolerancePct: v.sizeTolerancePct, maxCentringOffset: v.maxCentringOffset, maxAngleCorrection: v.maxAngleCorrection, notes: v.notes, version: v.version }),
  assign: (v, i) => Object.assign(v, i),
};
const MACHINE: NamedKind<LibraryMachine, MachineInput, MachineDto> = {
  entity: 'machine', cls: LibraryMachine, what: 'Machine profile', toDto: toMachineDto,
  snapshot: (m) => ({ name: m.name, reachX: m.reachX, reachY: m.reachY, nozzles: [...m.nozzles], maxPartHeight: m.maxPartHeight, notes: m.notes, version: m.version }),
  assign: (m, i) => Object.assign(m, i),
};

export class EquipmentService {
  constructor(
    private readonly ds: DataSource,
    private readonly log: RevisionLog,
  ) {}

  listNozzles = () => this.listNamed(NOZZLE);
  createNozzle = (i: NozzleInput, a: AuditActor, ip: string | null) => this.createNamed(NOZZLE, i, a, ip);
  updateNozzle = (id: string, i: NozzleInput & { version: number }, a: AuditActor, ip: string | null) => this.updateNamed(NOZZLE, id, i, a, ip);
  deleteNozzle = (id: string, v: number, a: AuditActor, ip: string | null) => this.deleteNamed(NOZZLE, id, v, a, ip);
  listPresets = () => this.listNamed(PRESET);
  createPreset = (i: VisionPresetInput, a: AuditActor, ip: string | null) => this.createNamed(PRESET, i, a, ip);
  updatePreset = (id: string, i: VisionPresetInput & { version: number }, a: AuditActor, ip: string | null) => this.updateNamed(PRESET, id, i, a, ip);
  deletePreset = (id: string, v: number, a: AuditActor, ip: string | null) => this.deleteNamed(PRESET, id, v, a, ip);
  listMachines = () => this.listNamed(MACHINE);
  createMachine = (i: MachineInput, a: AuditActor, ip: string | null) => this.createNamed(MACHINE, i, a, ip);
  updateMachine = (id: string, i: MachineInput & { version: number }, a: AuditActor, ip: string | null) => this.updateNamed(MACHINE, id, i, a, ip);
  deleteMachine = (id: string, v: number, a: AuditActor, ip: string | null) => this.deleteNamed(MACHINE, id, v, a, ip);

  private async listNamed<E extends Named, I, D>(k: NamedKind<E, I, D>): Promise<D[]> {
    const rows = await this.ds.getRepository(k.cls).find();
    return rows.sort((a, b) => (a.name.toLowerCase() < b.name.toLowerCase() ? -1 : 1)).map(k.toDto);
  }

  private async checkNamed<E extends Named, I extends { name: string }, D>(m: EntityManager, k: NamedKind<E, I, D>, input: I, selfId: string | null) {
    const rows = await m.getRepository(k.cls).find();
    const same = rows.find((r) => r.name.toLowerCase() === input.name.toLowerCase() && r.id !== selfId);
    if (same) throw new ConflictError(`${k.what} ${same.name} already exists.`, [{ path: 'name', message: `${same.name} already exists` }]);
    if (k.entity === 'machine') {
      const known = new Set((await m.getRepository(LibraryNozzle).find()).map((n) => n.name));
      const errors = ((input as unknown as MachineInput).nozzles ?? []).flatMap((n, i) => (known.has(n) ? [] : [{ path: `nozzles.${i}`, message: `Nozzle ${n} is not in the library` }]));
      if (errors.length) throw new ValidationError(`${errors[0].path}: ${errors[0].message}`, errors);
    }
  }

  private async createNamed<E extends Named, I extends { name: string }, D>(k: NamedKind<E, I, D>, input: I, actor: AuditActor, ip: string | null): Promise<D> {
    return this.ds.transaction(async (m) => {
      await this.checkNamed(m, k, input, null);
      const repo = m.getRepository(k.cls);
      const e = repo.create();
      k.assign(e, input);
      e.updatedBy = actor.email;
      await repo.save(e);
      await this.log.record(m, actor, k.entity, e.id, e.name, 'create', null, k.snapshot(e), ip);
      return k.toDto(e);
    });
  }

  private async updateNamed<E extends Named, I extends { name: string }, D>(k: NamedKind<E, I, D>, id: string, input: I & { version: number }, actor: AuditActor, ip: string | null): Promise<D> {
    return this.ds.transaction(async (m) => {
      const repo = m.getRepository(k.cls);
      const e = await repo.findOne({ where: { id } as never, lock: { mode: 'pessimistic_write' } });
      if (!e) throw new NotFoundError(`The ${k.what.toLowerCase()}`);
      if (e.version !== input.version) throw conflict(`${k.what} ${e.name}`, input.version, e.version);
      await this.checkNamed(m, k, input, id);
      const before = k.snapshot(e);
      const { version: _v, ...fields } = input;
      k.assign(e, fields as unknown as I);
      e.updatedBy = actor.email;
      await repo.save(e);
      if (before.name !== e.name) await this.renameReferences(m, k.entity, String(before.name), e.name);
      await this.log.record(m, actor, k.entity, e.id, e.name, 'update', before, k.snapshot(e), ip);
      return k.toDto(e);
    });
  }

  /** A renamed nozzle or preset keeps its packages and machines (their versions move on). */
  private async renameReferences(m: EntityManager, entity: string, from: string, to: string) {
    if (entity === 'nozzle') {
      await m.query(`UPDATE "library_packages" SET "nozzles" = array_replace("nozzles", $1, $2), "version" = "version" + 1 WHERE $1 = ANY("nozzles")`, [from, to]);
      await m.query(`UPDATE "library_machines" SET "nozzles" = array_replace("nozzles", $1, $2), "version" = "version" + 1 WHERE $1 = ANY("nozzles")`, [from, to]);
    } else if (entity === 'vision-preset') {
      await m.query(`UPDATE "library_packages" SET "vision" = $2, "version" = "version" + 1 WHERE "vision" = $1`, [from, to]);
    }
  }

  private async deleteNamed<E extends Named, I, D>(k: NamedKind<E, I, D>, id: string, version: number, actor: AuditActor, ip: string | null): Promise<void> {
    await this.ds.transaction(async (m) => {
      const repo = m.getRepository(k.cls);
      const e = await repo.findOne({ where: { id } as never, lock: { mode: 'pessimistic_write' } });
      if (!e) throw new NotFoundError(`The ${k.what.toLowerCase()}`);
      if (e.version !== version) throw conflict(`${k.what} ${e.name}`, version, e.version);
      let users: { name: string }[] = [];
      if (k.entity === 'nozzle') {
        users = [
          ...(await m.query(`SELECT "name" FROM "library_packages" WHERE $1 = ANY("nozzles") ORDER BY "name_key"`, [e.name])),
          ...(await m.query(`SELECT "name" FROM "library_machines" WHERE $1 = ANY("nozzles") ORDER BY "name"`, [e.name])),
        ];
      } else if (k.entity === 'vision-preset') {
        users = await m.query(`SELECT "name" FROM "library_packages" WHERE "vision" = $1 ORDER BY "name_key"`, [e.name]);
      }
      if (users.length) {
        const names = users.slice(0, 5).map((u) => u.name).join(', ') + (users.length > 5 ? ` and ${users.length - 5} more` : '');
        throw new ConflictError(`${k.what} ${e.name} is still used by ${names}; take it off them first.`);
      }
      await repo.delete({ id } as never);
      await this.log.record(m, actor, k.entity, id, e.name, 'delete', k.snapshot(e), null, ip);
    });
  }
}
