import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../server/db/data-source';
import { prepareTestDatabase } from '../helpers/db';

/**
 * The Reliability migration on a database that has lived before it: names that a race doubled
 * in mixed case are renamed so the unique index can be built, existing revisions get their
 * contributors from the author and the audit log, and placement counts are filled in.
 */
let ds: DataSource;
beforeAll(async () => {
  const url = await prepareTestDatabase(`${process.env.PW_TEST_DB_NAME ?? 'placewright_test'}_migration`);
  ds = createDataSource(url);
  await ds.initialize();
  // back to the schema before the migration under test (and any migration after it)
  while ((await ds.query(`SELECT 1 FROM migrations WHERE name = 'Reliability1796201900000'`)).length) await ds.undoLastMigration({ transaction: 'each' });
});
afterAll(async () => {
  await ds?.destroy();
});

describe('Reliability migration on existing data', () => {
  it('renames doubled names, fills contributors from the audit log and counts placements', async () => {
    const [ellis] = await ds.query(`INSERT INTO users (email, name, password_hash, roles) VALUES ('ellis@test.example', 'Ellis', 'x', '{engineer}') RETURNING id`);
    const [rowan] = await ds.query(`INSERT INTO users (email, name, password_hash, roles) VALUES ('rowan@test.example', 'Rowan', 'x', '{engineer}') RETURNING id`);
    const [p1] = await ds.query(`INSERT INTO programs (name, product, board, owner_id, created_at) VALUES ('led-strip', 'p', 'b', $1, now() - interval '2 hours') RETURNING id`, [ellis.id]);
    const [p2] = await ds.query(`INSERT INTO programs (name, product, board, owner_id, created_at) VALUES ('LED-Strip', 'p', 'b', $1, now() - interval '1 hour') RETURNING id`, [rowan.id]);
    const imported = { placements: [{ ref: 'R1', dnp: false }, { ref: 'R2', dnp: true }, { ref: 'R3', dnp: false }] };
    const [r1] = await ds.query(`INSERT INTO program_revisions (program_id, label, author_id, imported, created_at) VALUES ($1, 'A', $2, $3, now() - interval '2 hours') RETURNING id`, [p1.id, ellis.id, JSON.stringify(imported)]);
    await ds.query(`INSERT INTO program_revisions (program_id, label, author_id) VALUES ($1, 'A', $2)`, [p2.id, rowan.id]);
    // Rowan imported and submitted led-strip A; Ellis created it
    for (const action of ['revision.import', 'revision.submit', 'finding.waive']) {
      await ds.query(`INSERT INTO audit_events (actor_id, actor_email, action, target) VALUES ($1, 'rowan@test.example', $2, 'led-strip A')`, [rowan.id, action]);
    }
    await ds.query(`INSERT INTO library_nozzles (name, tip_outer, holder_radius, created_at) VALUES ('N07', 0.7, 3, now() - interval '1 hour'), ('n07', 0.7, 3, now())`);

    await ds.runMigrations({ transaction: 'each' });

    const names = (await ds.query(`SELECT name FROM programs ORDER BY created_at`)).map((r: { name: string }) => r.name);
    expect(names).toEqual(['led-strip', 'LED-Strip (2)']);
    const nozzles = (await ds.query(`SELECT name FROM library_nozzles ORDER BY created_at`)).map((r: { name: string }) => r.name);
    expect(nozzles).toEqual(['N07', 'n07 (2)']);
    await expect(ds.query(`INSERT INTO programs (name, product, board, owner_id) VALUES ('Led-Strip', 'p', 'b', $1)`, [ellis.id])).rejects.toMatchObject({ driverError: { code: '23505', constraint: 'uq_programs_name_ci' } });

    const contributors = await ds.query(`SELECT user_email, actions FROM revision_contributors WHERE revision_id = $1 ORDER BY user_email`, [r1.id]);
    expect(contributors).toEqual([
      { user_email: 'ellis@test.example', actions: ['create'] },
      { user_email: 'rowan@test.example', actions: ['import', 'submit', 'waiver'] },
    ]);
    const [{ placement_count }] = await ds.query(`SELECT placement_count FROM program_revisions WHERE id = $1`, [r1.id]);
    expect(placement_count).toBe(2);
  });

  it('goes down and up again', async () => {
    await ds.undoLastMigration({ transaction: 'each' });
    while ((await ds.query(`SELECT 1 FROM migrations WHERE name = 'Reliability1796201900000'`)).length) await ds.undoLastMigration({ transaction: 'each' });
    expect((await ds.query(`SELECT to_regclass('revision_contributors') AS t`))[0].t).toBeNull();
    await ds.runMigrations({ transaction: 'each' });
    expect((await ds.query(`SELECT to_regclass('revision_contributors') AS t`))[0].t).toBe('revision_contributors');
  });
});
