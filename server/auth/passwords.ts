import argon2 from 'argon2';
import { isTest } from '../env.ts';

// Tests lower the cost: argon2's defaults take about half a second per hash on 2 cores.
const options = isTest ? { memoryCost: 4096, timeCost: 2, parallelism: 1 } : {};

export const hashPassword = (plain: string) => argon2.hash(plain, { type: argon2.argon2id, ...options });
export const verifyPassword = (hash: string, plain: string) => argon2.verify(hash, plain).catch(() => false);
