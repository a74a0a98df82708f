import bcrypt from 'bcryptjs';
import { z } from 'zod';

/** bcrypt cost 10 (2^10 rounds): the usual floor for interactive sign-in (common practice), ~80 ms in bcryptjs. */
export const bcryptCost = 10;

export const passwordSchema = z.string().min(10, 'must be at least 10 characters').max(200, 'must be at most 200 characters');

export const hashPassword = (password: string) => bcrypt.hash(password, bcryptCost);
export const checkPassword = (password: string, hash: string) => bcrypt.compare(password, hash);

/** A real hash to compare against when the account does not exist, so both paths take as long. */
export const decoyHash = bcrypt.hashSync('decoy-password-never-valid', bcryptCost);
