// The demo users' shared password (README.md states it); MENISCUS_DEMO_PASSWORD changes it.
// Plain JS so the start command can print it before anything is installed.
export const DEFAULT_DEMO_PASSWORD = 'spirit-jar-demo-2026';
export const demoPassword = () => process.env.MENISCUS_DEMO_PASSWORD || DEFAULT_DEMO_PASSWORD;
