import { parseArgs, type ParseArgsConfig } from 'node:util';
import { z } from 'zod';

/**
 * The command lines of `npm run backup` and `npm run restore`, checked with zod like every other
 * boundary: a wrong argument stops the command with the usage line before anything happens.
 */
export class UsageError extends Error {
	override name = 'UsageError';
}

const Folder = z.string().trim().min(1, 'the folder must not be empty').refine((p) => !p.startsWith('-'), 'a folder name cannot start with "-"');

export const BackupArgsSchema = z.object({ folder: Folder.optional() });
export type BackupArgs = z.infer<typeof BackupArgsSchema>;

export const RestoreArgsSchema = z.object({ folder: Folder, force: z.boolean() });
export type RestoreArgs = z.infer<typeof RestoreArgsSchema>;

function read(argv: string[], options: NonNullable<ParseArgsConfig['options']>) {
	try {
		return parseArgs({ args: argv, options, allowPositionals: true, strict: true });
	} catch (err) {
		throw new UsageError((err as Error).message);
	}
}

function check<T>(schema: z.ZodType<T>, input: unknown): T {
	const parsed = schema.safeParse(input);
	if (!parsed.success) throw new UsageError(parsed.error.issues.map((i) => `${i.path.join('.') || 'arguments'}: ${i.message}`).join('; '));
	return parsed.data;
}

export function parseBackupArgs(argv: string[]): BackupArgs {
	const { positionals } = read(argv, {});
	if (positionals.length > 1) throw new UsageError(`give at most one folder, not ${positionals.length}`);
	return check(BackupArgsSchema, { folder: positionals[0] });
}

export function parseRestoreArgs(argv: string[]): RestoreArgs {
	const { positionals, values } = read(argv, { force: { type: 'boolean', default: false } });
	if (positionals.length !== 1) throw new UsageError(`give exactly one backup folder, not ${positionals.length}`);
	return check(RestoreArgsSchema, { folder: positionals[0], force: values.force });
}
