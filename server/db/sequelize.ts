import { Sequelize } from 'sequelize';
import { env } from '../env.ts';
import { dialectModule } from './driver.ts';

export function createSequelize(url = env.DATABASE_URL): Sequelize {
  const u = new URL(url);
  return new Sequelize(
    decodeURIComponent(u.pathname.slice(1)),
    decodeURIComponent(u.username),
    decodeURIComponent(u.password),
    {
      dialect: 'mariadb',
      dialectModule,
      host: u.hostname,
      port: Number(u.port || 3306),
      logging: env.DB_LOG === '1' ? console.log : false,
      timezone: '+00:00',
      dialectOptions: { connectTimeout: 10_000, bigIntAsNumber: true, decimalAsNumber: true },
      define: { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', underscored: false },
      pool: { max: 10, min: 0, idle: 10_000 },
    },
  );
}

export const sequelize = createSequelize();
