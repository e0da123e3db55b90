import { hash, verify } from '@node-rs/argon2';

// argon2id with OWASP's minimum (19 MiB, 2 passes, 1 lane); @node-rs/argon2 defaults to argon2id.
const OPTIONS = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

export const hashPassword = (password: string): Promise<string> => hash(password, OPTIONS);

let dummyHash: Promise<string> | undefined;

export async function verifyPassword(passwordHash: string | null, password: string): Promise<boolean> {
  // With no account, verify against a throwaway hash so a missing e-mail takes as long as a wrong password.
  dummyHash ??= hashPassword('revloop-no-such-account');
  const target = passwordHash ?? (await dummyHash);
  const ok = await verify(target, password).catch(() => false);
  return passwordHash !== null && ok;
}
