// Where `npm start` keeps its PostgreSQL cluster: db/cluster in the project. Run as root from a folder
// the postgres OS user cannot enter (a clone under /root, mode 700), the data goes to
// /var/lib/meniscus/<name>-<hash> instead and db/cluster becomes a symlink to it, so it still
// appears under db/. Nothing outside the project has its permissions changed.
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

function othersCanEnter(dir) {
	for (let d = dir; ; d = path.dirname(d)) {
		if ((fs.statSync(d).mode & 0o001) === 0) return false;
		if (d === path.dirname(d)) return true;
	}
}

export function clusterDataDir(root, log = console.log) {
	const link = path.join(root, 'db', 'cluster');
	if (fs.existsSync(link)) return path.join(fs.realpathSync(link), 'data');
	const isRoot = process.getuid?.() === 0;
	if (!isRoot || othersCanEnter(path.join(root, 'db'))) return path.join(link, 'data');
	const hash = createHash('sha256').update(root).digest('hex').slice(0, 8);
	const home = path.join('/var/lib/meniscus', `${path.basename(root)}-${hash}`);
	fs.mkdirSync(home, { recursive: true });
	fs.chmodSync('/var/lib/meniscus', 0o755);
	fs.symlinkSync(home, link);
	log(`The postgres OS user cannot enter ${root}; keeping the database in ${home} (linked from db/cluster).`);
	return path.join(home, 'data');
}
