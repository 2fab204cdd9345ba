import type { Transaction } from 'sequelize';
import type { Actor } from '../policies/index.ts';

/**
 * What every service takes: who acts, the transaction the whole change runs in, and the input.
 * The actor is the policy Actor (null for a visitor or the system); a service only signed-in people
 * reach takes `SignedInCtx`, whose actor is never null.
 */
export type ServiceCtx<I, A = Actor> = { actor: A; transaction: Transaction; input: I };

/** A service reached only by a signed-in person (the router has already required one). */
export type SignedInCtx<I> = ServiceCtx<I, NonNullable<Actor>>;

/** The actor and transaction alone, for helpers such as audit() that are called inside a service. */
export type TxCtx = Omit<ServiceCtx<never>, 'input'>;
