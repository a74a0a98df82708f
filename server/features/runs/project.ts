import { z } from 'zod';

/** A project (a firmware line, a product) that runs belong to: lower-case words, `-`, `_`, `.`, `/`. */
export const projectName = z
  .string()
  .trim()
  .min(1, 'name the project, e.g. "k65-firmware"')
  .max(80, 'must be at most 80 characters')
  .regex(/^[a-z0-9][a-z0-9._/-]*$/, 'lower-case letters, digits, ".", "_", "-" and "/", e.g. "k65-firmware"');

export const buildName = z.string().trim().min(1, 'must not be empty').max(200, 'must be at most 200 characters');

/** Runs started in the library without a project belong to this one. */
export const LIBRARY_PROJECT = 'library';
