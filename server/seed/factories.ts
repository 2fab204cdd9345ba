import type { Transaction } from 'sequelize';
import { Piece, User } from '../models/index.ts';
import type { Role } from '../../shared/roles.ts';
import { hashPassword } from '../auth/passwords.ts';

// Shared by the demo seed and the tests, so both build records the same way.
let counter = 0;
const next = () => `${Date.now().toString(36)}${(counter++).toString(36)}`;

export async function makeUser(
  attrs: Partial<{ email: string; name: string; role: Role; password: string; active: boolean }> = {},
  transaction?: Transaction,
) {
  const n = next();
  return User.create(
    {
      email: attrs.email ?? `user-${n}@example.test`,
      name: attrs.name ?? `Test user ${n}`,
      role: attrs.role ?? 'researcher',
      passwordHash: await hashPassword(attrs.password ?? 'correct horse battery'),
      active: attrs.active ?? true,
    },
    { transaction },
  );
}

export type PieceInput = Partial<Omit<Piece['_creationAttributes'], 'id'>>;

export async function makePiece(attrs: PieceInput = {}, transaction?: Transaction) {
  const n = next();
  return Piece.create(
    {
      accessionNumber: `T.${n}`,
      objectName: 'fragment',
      title: `Test piece ${n}`,
      dateText: null,
      dateEdtf: null,
      earliestYear: null,
      latestYear: null,
      place: null,
      fibres: ['cotton'],
      weave: null,
      threadCount: null,
      heightMm: null,
      widthMm: null,
      repeatMm: null,
      techniques: [],
      dyestuffs: [],
      historicalMordants: [],
      description: null,
      provenance: null,
      condition: null,
      creditLine: null,
      status: 'draft',
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}
