import { hash, verify } from '@node-rs/argon2';
import type { Env } from '../../env';

// argon2id with OWASP's minimum (19 MiB, 2 passes, 1 lane); @node-rs/argon2 defaults to argon2id.
const OWASP_MINIMUM = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;
// Tests only (env.ts refuses TEST_ONLY_HASH_COST outside NODE_ENV=test): 1 MiB, 1 pass, so factory sign-ins cost little.
const TEST_ONLY_LOW = { memoryCost: 1_024, timeCost: 1, parallelism: 1 } as const;
let options: typeof OWASP_MINIMUM | typeof TEST_ONLY_LOW = OWASP_MINIMUM;

/** Sets the cost of new hashes from the environment; createApp calls it. Verifying reads the cost stored in each hash. */
export function usePasswordHashCost(env: Pick<Env, 'TEST_ONLY_HASH_COST'>): void {
  options = env.TEST_ONLY_HASH_COST === 'low' ? TEST_ONLY_LOW : OWASP_MINIMUM;
}

export const hashPassword = (password: string): Promise<string> => hash(password, options);

let dummyHash: Promise<string> | undefined;

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  // With no account, verify against a throwaway hash so a missing e-mail takes as long as a wrong password.
  dummyHash ??= hashPassword('revloop-no-such-account');
  const target = passwordHash ?? (await dummyHash);
  const ok = await verify(target, password).catch(() => false);
  return passwordHash !== null && ok;
}
