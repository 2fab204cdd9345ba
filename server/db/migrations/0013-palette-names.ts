import { QueryTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import { shadeName, tradeShade } from '../../../shared/colour/names.ts';
import type { MigrationContext } from '../migrator.ts';

// Palette rows store the shade names given when they were computed. The naming rules changed
// (browns, olive, navy as a blue, the blue/purple boundary, tinted greys), so every stored name is
// derived again from the row's own L*a*b*. Names are derived data: down leaves them as they are.
const BATCH = 2000;

export const up: MigrationFn<MigrationContext> = async ({ context: { sequelize } }) => {
  for (let after = 0; ;) {
    const rows = await sequelize.query<{
      id: number;
      L: number;
      a: number;
      b: number;
      name: string;
      tradeName: string | null;
    }>('SELECT id, L, a, b, name, tradeName FROM palette_colours WHERE id > ? ORDER BY id LIMIT ?', {
      replacements: [after, BATCH],
      type: QueryTypes.SELECT,
    });
    if (!rows.length) return;
    after = rows[rows.length - 1].id;
    const changed = rows
      .map((r) => ({ id: r.id, before: r, name: shadeName(r), tradeName: tradeShade(r)?.name ?? null }))
      .filter((r) => r.name !== r.before.name || r.tradeName !== r.before.tradeName);
    if (!changed.length) continue;
    const ids = changed.map((r) => r.id);
    await sequelize.query(
      `UPDATE palette_colours SET name = CASE id ${changed.map(() => 'WHEN ? THEN ?').join(' ')} END,
         tradeName = CASE id ${changed.map(() => 'WHEN ? THEN ?').join(' ')} END WHERE id IN (?)`,
      {
        replacements: [...changed.flatMap((r) => [r.id, r.name]), ...changed.flatMap((r) => [r.id, r.tradeName]), ids],
      },
    );
  }
};

export const down: MigrationFn<MigrationContext> = async () => {};
