import fs from 'node:fs';
import fsp from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { signedInUser } from '../helpers/users.ts';
import { makeSpecimen, sampleJpeg, tusUpload } from '../helpers/photos.ts';
import { startOwnStack, type OwnStack } from '../helpers/ownStack.ts';
import { Photo } from '../../src/lib/server/models/index.ts';
import { ingestUpload } from '../../src/lib/server/photos/ingest.ts';

/**
 * TESTPLAN F5, the half a kill cannot show: the photo's files are on disk before the database
 * says they exist. After a power cut only what was fsynced survives, and a new name (a link, a
 * rename, a folder) only once the folder holding it is fsynced too (fsync(2): "Calling fsync()
 * does not necessarily ensure that the entry in the directory containing the file has also
 * reached disk. For that an explicit fsync() on a file descriptor for the directory is also
 * needed."). So, for a real upload ingested here with every fsync, mkdir, link and rename
 * recorded, and the moment the photo's transaction commits: every file of the master and of the
 * derivative set was fsynced before the commit, and every folder that gained an entry was fsynced
 * after it gained it and before the commit. A stack of the test's own (ownStack.ts) with no worker
 * keeps the job for this process; the ingest is the worker's own function.
 */
type Event = { op: 'fsync' | 'mkdir' | 'link' | 'rename' | 'commit'; path: string; from?: string };

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-durable-'));
const uploads = path.join(tmp, 'uploads');
let stack: OwnStack | undefined;
let cookie = '';
let specimenId = '';
const started = Date.now();

beforeAll(async () => {
	fs.chmodSync(tmp, 0o755);
	stack = await startOwnStack('durable', uploads);
	({ cookie } = await signedInUser('conservator', 'durable'));
	specimenId = await makeSpecimen(cookie, 'DUR', stack.base);
}, 180_000);

afterAll(async () => {
	vi.restoreAllMocks();
	await stack?.stop();
	fs.rmSync(tmp, { recursive: true, force: true });
	console.log(`[F5 order] file took ${((Date.now() - started) / 1000).toFixed(1)} s`);
});

/** Records the file-system calls the ingest makes (node:fs/promises is one shared object) and the commit. */
function record(): Event[] {
	const events: Event[] = [];
	const open = fsp.open.bind(fsp);
	vi.spyOn(fsp, 'open').mockImplementation(async (file, ...rest) => {
		const h = await open(file, ...rest);
		const sync = h.sync.bind(h);
		h.sync = async () => {
			await sync();
			events.push({ op: 'fsync', path: path.resolve(String(file)) });
		};
		return h;
	});
	const mkdir = fsp.mkdir.bind(fsp);
	vi.spyOn(fsp, 'mkdir').mockImplementation((async (dir: fs.PathLike, options?: fs.MakeDirectoryOptions) => {
		const first = await mkdir(dir, options);
		// With recursive, every folder from the first one made down to dir is new.
		if (options?.recursive) {
			if (first) for (let d = path.resolve(String(dir)); ; d = path.dirname(d)) {
				events.push({ op: 'mkdir', path: d });
				if (d === path.resolve(first)) break;
			}
		} else events.push({ op: 'mkdir', path: path.resolve(String(dir)) });
		return first;
	}) as typeof fsp.mkdir);
	for (const op of ['link', 'rename'] as const) {
		const real = fsp[op].bind(fsp);
		vi.spyOn(fsp, op).mockImplementation(async (from: fs.PathLike, to: fs.PathLike) => {
			await real(from, to);
			events.push({ op, path: path.resolve(String(to)), from: path.resolve(String(from)) });
		});
	}
	const create = Photo.create.bind(Photo);
	vi.spyOn(Photo, 'create').mockImplementation(((values: never, options: { transaction: { afterCommit(fn: () => void): void } }) => {
		options.transaction.afterCommit(() => events.push({ op: 'commit', path: '' }));
		return create(values, options as never);
	}) as never);
	return events;
}

function filesBelow(dir: string): string[] {
	return fs.readdirSync(dir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
}

describe('the order of an ingest (TESTPLAN F5: fsync file, then folder, then commit)', () => {
	it('syncs every file of the photo and every folder that gained an entry before its row commits', async () => {
		const { id } = await tusUpload(await sampleJpeg(1400, 1000), { cookie, endpoint: `${stack!.base}/api/uploads/`, meta: { filename: 'durable.jpg', filetype: 'image/jpeg', specimenId, view: 'front', stage: 'as-found' } });
		const events = record();
		const outcome = await ingestUpload(id);
		vi.restoreAllMocks();
		expect(outcome.state).toBe('recorded');
		const photo = (await Photo.findOne({ where: { uploadId: id } }))!;
		const commit = events.findIndex((e) => e.op === 'commit');
		expect(commit).toBeGreaterThan(0);

		// The set was made in work/<set> and renamed into place: a name there stands for its final one.
		const setDir = path.join(uploads, 'derivatives', photo.id, photo.derivativeSet);
		const workDir = path.join(uploads, 'work', photo.derivativeSet);
		const names = (p: string) => [p, p.startsWith(setDir) ? workDir + p.slice(setDir.length) : p];
		const synced = (p: string, after: number) => events.findIndex((e, i) => i > after && i < commit && e.op === 'fsync' && names(p).includes(e.path));
		const lastEntryIn = (dir: string) => events.reduce((last, e, i) => (i < commit && e.op !== 'fsync' && e.op !== 'commit' && names(dir).includes(path.dirname(e.path)) ? i : last), -1);

		const master = path.join(uploads, photo.masterPath);
		const files = [master, ...filesBelow(setDir)];
		const unsynced = files.filter((f) => synced(f, -1) < 0);
		const folders = new Set<string>();
		for (const f of files) for (let d = path.dirname(f); d !== uploads; d = path.dirname(d)) folders.add(d);
		const fileNames = new Set(files.flatMap(names));
		const lateFolders = [...folders].filter((d) => {
			// The files libvips wrote into a folder are not seen being made: their own fsyncs stand for it.
			const lastFile = events.reduce((last, e, i) => (i < commit && e.op === 'fsync' && fileNames.has(e.path) && names(d).includes(path.dirname(e.path)) ? i : last), -1);
			return synced(d, Math.max(lastEntryIn(d), lastFile)) < 0;
		});
		console.log(`[F5 order] ${events.filter((e) => e.op === 'fsync').length} fsyncs, ${files.length} files, ${folders.size} folders before the commit (event ${commit} of ${events.length})`);
		expect(files.length).toBeGreaterThan(5);
		expect(unsynced.map((f) => path.relative(uploads, f))).toEqual([]);
		expect(lateFolders.map((d) => path.relative(uploads, d)).sort()).toEqual([]);
	}, 120_000);
});
