import bcrypt from 'bcryptjs';

export interface PasswordHasher {
  hash(password: string): Promise<string>;
  /** Compares against `passwordHash`, or against a dummy hash of the same cost
   * when there is no account, so the time taken does not reveal whether an
   * address is registered. */
  verify(password: string, passwordHash: string | null): Promise<boolean>;
}

export function createPasswordHasher(options: { rounds: number }): PasswordHasher {
  // Made up front, so the first unknown address is not slower than later ones.
  const dummyHash = bcrypt.hash('paraxia-no-such-account', options.rounds);
  return {
    hash: (password) => bcrypt.hash(password, options.rounds),
    async verify(password, passwordHash) {
      if (passwordHash === null) {
        await bcrypt.compare(password, await dummyHash);
        return false;
      }
      return bcrypt.compare(password, passwordHash);
    },
  };
}
