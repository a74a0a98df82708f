import type { EntityManager } from '@mikro-orm/better-sqlite';
import { DeviceUnderTest, Organisation, User, type Role } from './entities.ts';
import type { Clock } from '../context.ts';
import { checkPassword, hashPassword } from '../features/auth/passwords.ts';
import { seedDemoTraces } from './demo-traces/seed-traces.ts';
import type { TraceStore } from '../storage/types.ts';
import { createLocalTraceStore } from '../storage/local-store.ts';
import { seedTeamLibrary } from '../features/vectors/seed.ts';

export const demoPassword = 'parley-demo';
export const demoOrganisation = 'Kestrel Devices';

/** The five demo accounts of the API contract: `<role>@kestrel.example`. Invented names. */
export const demoAccounts: { email: string; name: string; role: Role }[] = [
  { email: 'admin@kestrel.example', name: 'Avery Admin', role: 'admin' },
  { email: 'engineer@kestrel.example', name: 'Emery Engineer', role: 'engineer' },
  { email: 'qa@kestrel.example', name: 'Quinn Tester', role: 'qa' },
  { email: 'support@kestrel.example', name: 'Sasha Support', role: 'support' },
  { email: 'viewer@kestrel.example', name: 'Vic Viewer', role: 'viewer' },
];

/**
 * PDO words of the demo devices, capability flags all zero.
 * Fixed (USB PD R3.2 Table 6.9): bits 31..30 = 00, voltage in 50 mV units in bits 19..10, maximum current in 10 mA units in bits 9..0.
 * SPR PPS APDO (Table 6.14): bits 31..30 = 11, 29..28 = 00, maximum voltage in 100 mV units in 24..17,
 * minimum voltage in 100 mV units in 15..8, maximum current in 50 mA units in 6..0.
 * Sink fixed (Table 6.17): the same voltage and operational-current fields as the source's.
 */
export const demoDevices = [
  {
    name: 'Kestrel K65 travel adapter',
    maker: demoOrganisation,
    model: 'K65',
    role: 'source' as const,
    ratingLabel: '5V⎓3A 9V⎓3A 15V⎓3A 20V⎓3.25A 65W max',
    pdpW: 65,
    // 5 V 3 A, 9 V 3 A, 15 V 3 A, 20 V 3.25 A, PPS 3.3–21 V 3 A
    pdos: ['0001912c', '0002d12c', '0004b12c', '00064145', 'c1a4213c'],
    notes: 'Fictional demo source: single USB-C port wall adapter with PPS.',
  },
  {
    name: 'Kestrel D100 desk charger',
    maker: demoOrganisation,
    model: 'D100',
    role: 'source' as const,
    ratingLabel: '5V⎓3A 9V⎓3A 15V⎓3A 20V⎓5A 100W max',
    pdpW: 100,
    // 5 V 3 A, 9 V 3 A, 15 V 3 A, 20 V 5 A (needs a 5 A cable), PPS 3.3–21 V 5 A
    pdos: ['0001912c', '0002d12c', '0004b12c', '000641f4', 'c1a42164'],
    notes: 'Fictional demo source: 100 W desk charger; 5 A offers need a 5 A rated cable.',
  },
  {
    name: 'Kestrel Wren 14 laptop',
    maker: demoOrganisation,
    model: 'Wren 14',
    role: 'sink' as const,
    ratingLabel: 'Input 20V⎓3.25A',
    pdpW: 65,
    // Sink capabilities: 5 V 3 A, 15 V 3 A, 20 V 3.25 A
    pdos: ['0001912c', '0004b12c', '00064145'],
    notes: 'Fictional demo sink: 14-inch laptop that charges from 45 W and prefers 20 V.',
  },
];

/**
 * Fills an empty database with the demo organisation, accounts and devices; does nothing otherwise.
 * With a `dataDir` (the server's PARLEY_DATA) it also stores and analyses the demo traces and
 * fills the team library from the built-in `vectors/` folder.
 */
export async function seedDemo(em: EntityManager, clock: Clock, options: { dataDir?: string; traceStore?: TraceStore } = {}): Promise<boolean> {
  if ((await em.count(User)) > 0 || (await em.count(Organisation)) > 0) return false;
  const now = clock.now();
  const passwordHash = await hashPassword(demoPassword);
  em.create(Organisation, { name: demoOrganisation, createdAt: now });
  for (const account of demoAccounts) {
    em.create(User, { ...account, passwordHash, active: true, invitePending: false, sessionVersion: 1, createdAt: now, lastSignInAt: null });
  }
  for (const device of demoDevices) em.create(DeviceUnderTest, { ...device, createdAt: now, updatedAt: now });
  await em.flush();
  if (options.dataDir) await seedDemoTraces(em, clock, options.traceStore ?? createLocalTraceStore(options.dataDir));
  if (options.dataDir) await seedTeamLibrary(em, clock);
  return true;
}

/** Active demo accounts that still take the published demo password (a production server refuses to start with any). */
export async function accountsWithDemoPassword(em: EntityManager): Promise<string[]> {
  const users = await em.find(User, { email: { $in: demoAccounts.map((a) => a.email) }, active: true });
  const exposed: string[] = [];
  for (const user of users) if (user.passwordHash && (await checkPassword(demoPassword, user.passwordHash))) exposed.push(user.email);
  return exposed;
}
