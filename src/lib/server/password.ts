import { hash, verify } from "@node-rs/argon2";

// OWASP's minimum argon2id settings (19 MiB, 2 passes, 1 lane); from memory of the OWASP Password Storage Cheat Sheet.
const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(stored: string | null, password: string): Promise<boolean> {
  if (!stored) {
    // Hash anyway so an unknown account costs the same time as a wrong password.
    await hash(password, OPTIONS);
    return false;
  }
  try {
    return await verify(stored, password);
  } catch {
    return false;
  }
}
