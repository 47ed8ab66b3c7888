import bcrypt from 'bcryptjs';

/** Cost 12 in production; 10 elsewhere keeps seeding and tests quick (bcryptjs is pure JS). */
const rounds = (): number => (process.env.NODE_ENV === 'production' ? 12 : 10);

export const hashPassword = (password: string): Promise<string> => bcrypt.hash(password, rounds());

// A real hash of a throwaway string: comparing against it when no person matches keeps the
// response time the same, so timing does not reveal which e-mails exist.
const DUMMY_HASH = bcrypt.hashSync('no-such-person', rounds());

export async function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
  if (!hash) {
    await bcrypt.compare(password, DUMMY_HASH);
    return false;
  }
  return bcrypt.compare(password, hash);
}
