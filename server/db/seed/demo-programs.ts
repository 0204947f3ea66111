import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DataSource } from 'typeorm';
import { settingsFromJob, type RevisionSettings } from '../../../shared/schemas/program.schema';
import { Program } from '../entities/program.entity';
import { User } from '../entities/user.entity';
import { AuditService } from '../../modules/audit/audit.service';
import { getLibraryFile } from '../../modules/library/library.service';
import { recordUnmatchedFootprints } from '../../modules/library/unmatched.service';
import type { Mailer } from '../../modules/mail/mailer';
import { CheckPool } from '../../modules/programs/check-pool';
import { ProgramService, type ServiceUser } from '../../modules/programs/program.service';
import { UserService } from '../../modules/users/user.service';

const SAMPLES = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'samples');

function sampleSettings(jobRel: string, tweak: (s: RevisionSettings) => void = () => {}): RevisionSettings {
  const settings = settingsFromJob(JSON.parse(readFileSync(join(SAMPLES, jobRel), 'utf8')));
  tweak(settings);
  return settings;
}

/** The demo is data, not news: nothing is mailed while seeding. */
const silentMailer = { sendQuietly: async () => {}, send: async () => {} } as unknown as Mailer;

/**
 * The demo scenario's two programs, so a newcomer sees the product at work:
 * - `led-strip` (LED status strip, 4 × 5 panel, alternate columns turned 180°): released, with run files;
 * - `weather-ctl` (weather-station controller, 2-up, both sides): in review, with two planted
 *   fiducial-clearance findings (the local fiducials were given a 3 mm clear radius) waived by
 *   the author with a reason, waiting for Rowan's review.
 * Idempotent: a program that exists is left as it is.
 */
export async function seedDemoPrograms(ds: DataSource, log: (s: string) => void = () => {}): Promise<void> {
  const users = ds.getRepository(User);
  const ellis = await users.findOneBy({ email: 'ellis@harrowcreek.example' });
  const rowan = await users.findOneBy({ email: 'rowan@harrowcreek.example' });
  if (!ellis || !rowan) return;
  const as = (u: User): ServiceUser => ({ id: u.id, email: u.email, roles: u.roles });
  const audit = new AuditService(ds);
  const checks = new CheckPool();
  const programs = new ProgramService(ds, {
    audit,
    mailer: silentMailer,
    users: new UserService(ds, audit),
    library: { getLibraryFile: (m) => getLibraryFile(m ?? ds.manager), recordUnmatchedFootprints },
    checks,
    publicUrl: 'http://localhost:3000',
  });
  const exists = (name: string) => ds.getRepository(Program).existsBy({ name });

  try {
    if (!(await exists('led-strip'))) {
      const p = await programs.createProgram({ name: 'led-strip', product: 'LED status strip HCI-LS2', board: 'HCI-LS2 rev A' }, as(ellis), null);
      const revId = p.revisions[0].id;
      const settings = sampleSettings('led-strip/job.json');
      let rev = await programs.getRevisionEntity(revId);
      await programs.commitImport(revId, readFileSync(join(SAMPLES, 'led-strip/led-strip.csv')), 'led-strip.csv', settings.import, rev.version, as(ellis), null);
      rev = await programs.getRevisionEntity(revId);
      await programs.updateSettings(revId, settings, rev.version, as(ellis), null);
      await programs.check(revId, as(ellis), null);
      await programs.submit(revId, as(ellis), null);
      await programs.approve(revId, 'Alternate columns checked on the canvas: D1 cathode marks turn with the boards.', as(rowan), null);
      log('seeded program led-strip (released)');
    }
    if (!(await exists('weather-ctl'))) {
      const p = await programs.createProgram({ name: 'weather-ctl', product: 'Weather-station controller WSC-200', board: 'WSC-200 rev 3' }, as(ellis), null);
      const revId = p.revisions[0].id;
      const settings = sampleSettings('weather-station/job.json', (s) => {
        for (const f of s.fiducials) if (f.frame === 'board') f.clearRadius = 3.0;
      });
      let rev = await programs.getRevisionEntity(revId);
      await programs.commitImport(revId, readFileSync(join(SAMPLES, 'weather-station/weather-ctl.csv')), 'weather-ctl.csv', settings.import, rev.version, as(ellis), null);
      rev = await programs.getRevisionEntity(revId);
      await programs.updateSettings(revId, settings, rev.version, as(ellis), null);
      await programs.check(revId, as(ellis), null);
      rev = await programs.getRevisionEntity(revId);
      for (const f of (rev.findings ?? []) as { key: string; severity: string; kind: string }[]) {
        if (f.severity === 'error' && f.kind === 'fiducial-clearance') {
          await programs.waive(revId, f.key, 'R24 is a 0.5 mm tall 0402 at the edge of the 3 mm keep-out; the camera sees the whole fiducial. Accepted for this run.', as(ellis), null);
        }
      }
      await programs.submit(revId, as(ellis), null);
      log('seeded program weather-ctl (in review)');
    }
  } finally {
    await checks.close();
  }
}
