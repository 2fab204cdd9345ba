import { readFileSync } from 'node:fs';
import path from 'node:path';
import { ROOT_DIR } from './env.ts';

export const APP_VERSION: string = JSON.parse(readFileSync(path.join(ROOT_DIR, 'package.json'), 'utf8')).version;
