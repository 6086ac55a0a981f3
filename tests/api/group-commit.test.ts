// Group commit (server/db/group-commit.ts): writes of one turn share a COMMIT, each in its own
// savepoint; a write is acknowledged only once a second connection can see it.
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import Database from 'better-sqlite3';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { groupCommit } from '../../server/db/group-commit';

let dir: string;
let writer: Database.Database;
let reader: Database.Database;

beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'sw-group-'));
  writer = new Database(join(dir, 'g.db'));
  writer.pragma('journal_mode = WAL');
  writer.pragma('synchronous = FULL');
  writer.exec('create table t (k text primary key, v integer not null)');
  reader = new Database(join(dir, 'g.db'), { readonly: true });
});
afterEach(() => {
  reader.close();
  writer.close();
  rmSync(dir, { recursive: true, force: true });
});

const insert = (k: string, v: number) => () => writer.prepare('insert into t values (?, ?)').run(k, v).changes;
const seen = () => reader.prepare('select k from t order by k').pluck().all() as string[];

describe('group commit', () => {
  test('when writes arrive in one turn, then each resolves only after its row is committed for other connections', async () => {
    const q = groupCommit(writer);
    const acknowledged: string[][] = [];
    const writes = ['a', 'b', 'c'].map((k, i) => q.run(insert(k, i)).then(() => acknowledged.push(seen())));
    // Nothing is visible before the group has run.
    expect(seen()).toEqual([]);
    await Promise.all(writes);
    // Every acknowledgement already saw all three rows: they were committed together, before any answer.
    expect(acknowledged).toEqual([
      ['a', 'b', 'c'],
      ['a', 'b', 'c'],
      ['a', 'b', 'c'],
    ]);
  });

  test('when one write of a group fails, then only it is rolled back and the others are stored', async () => {
    const q = groupCommit(writer);
    const results = await Promise.allSettled([
      q.run(insert('a', 1)),
      q.run(() => {
        insert('b', 2)();
        insert('a', 3)(); // primary key clash: this whole write must go, 'b' with it
      }),
      q.run(insert('c', 4)),
    ]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect(seen()).toEqual(['a', 'c']);
    expect(reader.prepare('select v from t where k = ?').pluck().get('a')).toBe(1);
  });

  test('when a write sees the writes before it in the same group, then it reads them as if committed', async () => {
    const q = groupCommit(writer);
    const [, count] = await Promise.all([q.run(insert('a', 1)), q.run(() => writer.prepare('select count(*) from t').pluck().get())]);
    expect(count).toBe(1);
  });

  test('when an error ends the whole transaction, then every write of the group fails and nothing is stored', async () => {
    const q = groupCommit(writer);
    const results = await Promise.allSettled([
      q.run(insert('a', 1)),
      q.run(() => {
        writer.exec('ROLLBACK'); // what SQLite does itself on disk full or an I/O error
        throw new Error('disk I/O error');
      }),
      q.run(insert('c', 3)),
    ]);
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected', 'rejected']);
    expect(seen()).toEqual([]);
    // The queue still works afterwards.
    await q.run(insert('d', 4));
    expect(seen()).toEqual(['d']);
  });

  test('when a batch holds more writes than a group takes, then it is still committed whole, in order, after the writes queued before it', async () => {
    const q = groupCommit(writer);
    const singles = Array.from({ length: 100 }, (_, i) => q.run(insert(`s${String(i).padStart(3, '0')}`, i)).then(() => seen().length));
    const batch = q.batch();
    const order: number[] = [];
    const writes = Array.from({ length: 300 }, (_, i) =>
      batch
        .run(() => {
          order.push(i);
          return insert(`b${String(i).padStart(3, '0')}`, i)();
        })
        .then(() => seen().length),
    );
    // Nothing of the batch runs before it is submitted.
    await Promise.all(singles);
    expect(order).toEqual([]);
    await batch.submit();
    // Every write of the batch was acknowledged after all 300 were visible: one COMMIT.
    expect(new Set(await Promise.all(writes))).toEqual(new Set([400]));
    expect(order).toEqual(Array.from({ length: 300 }, (_, i) => i));
  });

  test('when one write of a batch fails, then the batch commits the others and reports that write alone', async () => {
    const q = groupCommit(writer);
    const batch = q.batch();
    const results = Promise.allSettled([batch.run(insert('a', 1)), batch.run(insert('a', 2)), batch.run(insert('b', 3))]);
    await batch.submit();
    expect((await results).map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect(seen()).toEqual(['a', 'b']);
  });

  test('when the group holding a batch fails, then submit rejects, every write of it fails and nothing is stored', async () => {
    const q = groupCommit(writer);
    const batch = q.batch();
    const results = Promise.allSettled([
      batch.run(insert('a', 1)),
      batch.run(() => {
        writer.exec('ROLLBACK');
        throw new Error('disk I/O error');
      }),
    ]);
    await expect(batch.submit()).rejects.toThrow('disk I/O error');
    expect((await results).map((r) => r.status)).toEqual(['rejected', 'rejected']);
    expect(seen()).toEqual([]);
  });
});
