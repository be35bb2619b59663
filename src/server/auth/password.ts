import { availableParallelism } from 'node:os';
import { hash, verify } from '@node-rs/argon2';
import { fifoLimiter } from '../turns';

// argon2id with the OWASP password-storage minimums (19 MiB, 2 passes, 1 lane): about 30 ms here.
const OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

// Hashing is CPU-bound: one per core at a time, the rest in arrival order, so that under a burst of
// sign-ins each waits its turn instead of some waiting many times longer than others.
const inTurn = fifoLimiter(Math.max(1, availableParallelism()));

export function hashPassword(password: string): Promise<string> {
  return inTurn(() => hash(password, OPTIONS));
}

export async function verifyPassword(hashed: string, password: string): Promise<boolean> {
  try {
    return await inTurn(() => verify(hashed, password));
  } catch {
    return false;
  }
}

/** A real hash of a random string, verified against when the e-mail is unknown so both paths take the same time. */
let decoy: Promise<string> | undefined;
export function decoyHash(): Promise<string> {
  decoy ??= hashPassword(crypto.randomUUID());
  return decoy;
}
