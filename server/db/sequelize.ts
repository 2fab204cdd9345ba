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
      // A frozen or unreachable database answers 503 (server/http/errors.ts) within seconds instead of hanging:
      // socketTimeout closes a connection whose server stays silent for DB_QUERY_TIMEOUT_MS (0 = never).
      dialectOptions: {
        connectTimeout: Math.min(10_000, env.DB_ACQUIRE_TIMEOUT_MS),
        socketTimeout: env.DB_QUERY_TIMEOUT_MS,
        bigIntAsNumber: true,
        decimalAsNumber: true,
      },
      define: { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', underscored: false },
      // acquire: how long a request waits for a connection. Idle connections are released before the socket
      // timeout would close them under the pool.
      pool: {
        max: 10,
        min: 0,
        idle: env.DB_QUERY_TIMEOUT_MS ? Math.min(10_000, Math.floor(env.DB_QUERY_TIMEOUT_MS / 2)) : 10_000,
        acquire: env.DB_ACQUIRE_TIMEOUT_MS,
      },
    },
  );
}

export const sequelize = createSequelize();
