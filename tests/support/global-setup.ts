// Runs once before every suite: bring the test database to the latest schema
// and seed the reference vocabularies and the demo scenario (idempotent).
export default async function setup() {
  const { migrate, seed } = await import('../../server/db/setup.ts');
  const { sequelize } = await import('../../server/models/index.ts');
  await migrate();
  await seed('demo');
  await sequelize.close();
}
