// Migrations, then the demo collection if the database is empty. Run by `npm start` (through tsx)
// with DATABASE_URL set; prints one line per step.
import { openSequelize } from '../src/lib/server/db.ts';
import { migrateUp } from '../db/migrate.ts';
import { demoPassword, seedDemo } from '../db/seeders/demo.ts';
import { insertGenerated } from '../db/seeders/generated.ts';
import { seedDemoPhotos } from '../db/seeders/demoPhotos.ts';
import { closeDb } from '../src/lib/server/db.ts';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set.');
const sequelize = openSequelize(url);
try {
	const applied = await migrateUp(sequelize);
	console.log(applied.length ? `Applied migrations: ${applied.join(', ')}` : 'Database schema is up to date.');
	if (process.env.MENISCUS_SEED !== 'none') {
		const r = await seedDemo(sequelize, { password: demoPassword() });
		console.log(r.seeded ? `Seeded the demo collection: ${r.users} users, ${r.specimens} specimens, ${r.checks} condition checks.` : `Demo data not added: ${r.reason}.`);
		if (r.seeded && process.env.MENISCUS_SEED_PHOTOS !== 'none') {
			const started = Date.now();
			const n = await seedDemoPhotos(sequelize);
			console.log(`Drew and recorded ${n} demo photographs in ${((Date.now() - started) / 1000).toFixed(0)} s.`);
		}
		// Optional: many invented jars to try the register at scale (only with a fresh demo).
		const large = Number(process.env.MENISCUS_SEED_LARGE ?? 0);
		if (r.seeded && large > 0) console.log(`Added ${await insertGenerated(sequelize, Math.min(large, 200_000))} generated specimens.`);
	}
} finally {
	await sequelize.close();
	await closeDb();
}
