import fs from 'node:fs';
import fsp from 'node:fs/promises';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type stream from 'node:stream';
import type http from 'node:http';
import { FileStore } from '@tus/file-store';
import { ERRORS, type Upload } from '@tus/server';
import { isOutOfSpace, OUT_OF_SPACE } from './diskFull.ts';
import { incomingFile } from './incoming.ts';

/**
 * tus's FileStore over incoming/, except that a full disk says so. FileStore.write turns every write
 * error into FILE_WRITE_ERROR (a bare 500) and drops the errno, so its write is repeated here with
 * that one difference: ENOSPC becomes OUT_OF_SPACE (507). The bytes written before the disk filled
 * stay in the file, whose size is the offset HEAD reports. A creation that runs out of space leaves
 * no half-written info file behind for the reconciler to stumble on.
 */
export class IncomingStore extends FileStore {
	override async create(file: Upload): Promise<Upload> {
		try {
			return await super.create(file);
		} catch (err) {
			if (!isOutOfSpace(err)) throw err;
			const bytes = incomingFile(file.id);
			await Promise.all([fsp.rm(bytes, { force: true }), fsp.rm(`${bytes}.json`, { force: true })]).catch(() => {});
			throw OUT_OF_SPACE;
		}
	}

	override async write(readable: http.IncomingMessage | stream.Readable, fileId: string, offset: number): Promise<number> {
		const writable = fs.createWriteStream(incomingFile(fileId), { flags: 'r+', start: offset });
		let received = 0;
		const count = new Transform({
			transform(chunk: Buffer, _encoding, done) {
				received += chunk.length;
				done(null, chunk);
			},
		});
		try {
			await pipeline(readable, count, writable);
		} catch (err) {
			throw isOutOfSpace(err) ? OUT_OF_SPACE : ERRORS.FILE_WRITE_ERROR;
		}
		return offset + received;
	}
}
