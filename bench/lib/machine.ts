import fs from 'node:fs';
import os from 'node:os';
import { spawnSync } from 'node:child_process';
import sharp from 'sharp';
import { table } from './report.ts';
import { findImageMagick } from './tools.ts';

function firstLine(cmd: string, args: string[]): string | null {
	const r = spawnSync(cmd, args, { encoding: 'utf8' });
	if (r.status !== 0 || !r.stdout) return null;
	return r.stdout.split('\n')[0]!.trim();
}

/** The machine a report was measured on, for its header. */
export interface Machine {
	cpu: string;
	cores: number;
	memory: string;
	os: string;
	node: string;
	sharp: string;
	libvips: string;
	imagemagick: string;
	postgres: string;
}

export function machine(): Machine {
	const info = fs.readFileSync('/proc/cpuinfo', 'utf8');
	const model = /^model name\s*:\s*(.+)$/m.exec(info)?.[1]?.trim() ?? os.cpus()[0]?.model ?? 'unknown';
	const debian = fs.existsSync('/etc/debian_version') ? ` (Debian ${fs.readFileSync('/etc/debian_version', 'utf8').trim()})` : '';
	const versions = sharp.versions as Record<string, string | undefined>;
	return {
		cpu: model,
		cores: os.availableParallelism(),
		memory: `${(os.totalmem() / 2 ** 30).toFixed(1)} GiB`,
		os: `${os.type()} ${os.release()}${debian}`,
		node: process.version,
		sharp: versions.sharp ?? 'unknown',
		libvips: versions.vips ?? 'unknown',
		imagemagick: findImageMagick()?.version ?? 'not installed',
		postgres: firstLine('/usr/lib/postgresql/15/bin/postgres', ['--version']) ?? firstLine('postgres', ['--version']) ?? 'not found',
	};
}

export function machineMarkdown(m: Machine, extra: readonly (readonly [string, string])[] = []): string {
	return table(
		['', ''],
		[
			['CPU', `${m.cpu} (/proc/cpuinfo), ${m.cores} cores available`],
			['Memory', m.memory],
			['OS', m.os],
			['Node.js', m.node],
			['sharp / libvips', `${m.sharp} / ${m.libvips}`],
			['ImageMagick', m.imagemagick],
			['PostgreSQL', m.postgres],
			...extra,
		],
	);
}
