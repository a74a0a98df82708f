import { z } from 'zod';
import { deviceRoles, roleGroups, type Device } from '../../../shared/api/index.ts';
import { DeviceUnderTest, type IDeviceUnderTest } from '../../db/entities.ts';
import { notFound } from '../../errors.ts';
import { route, type RouteDef } from '../../route-def.ts';
import { idParams } from '../../http/schemas.ts';

/** One 32-bit PDO word: 8 hex digits, optional 0x; stored lower-case without the prefix. */
const pdoHex = z
  .string()
  .trim()
  .regex(/^(0x)?[0-9a-fA-F]{8}$/, 'must be 8 hex digits, e.g. 0001912c')
  .transform((s) => s.replace(/^0x/, '').toLowerCase());

const deviceFields = {
  name: z.string().trim().min(1, 'is required').max(120),
  maker: z.string().trim().max(120),
  model: z.string().trim().max(120),
  role: z.enum(deviceRoles),
  ratingLabel: z.string().trim().max(200),
  pdpW: z.number().int().min(0).max(240),
  // A Source_Capabilities message holds at most 7 objects; EPR capabilities up to 11 (USB PD R3.2 §6.5.15.1, from memory).
  pdos: z.array(pdoHex).max(11),
  notes: z.string().max(4000),
};

const createSchema = z.object({
  ...deviceFields,
  maker: deviceFields.maker.default(''),
  model: deviceFields.model.default(''),
  ratingLabel: deviceFields.ratingLabel.default(''),
  pdos: deviceFields.pdos.default([]),
  notes: deviceFields.notes.default(''),
});

const patchSchema = z
  .object(deviceFields)
  .partial()
  .refine((b) => Object.keys(b).length > 0, 'give at least one field');

const present = (d: IDeviceUnderTest): Device => ({
  id: d.id,
  name: d.name,
  maker: d.maker,
  model: d.model,
  role: d.role,
  ratingLabel: d.ratingLabel,
  pdpW: d.pdpW,
  pdos: d.pdos,
  notes: d.notes,
});

const editors = roleGroups.editors;

export const devicesRoutes: RouteDef[] = [
  route({
    method: 'get',
    path: '/api/devices',
    access: 'signed-in',
    async handler({ em }) {
      const devices = await em.find(DeviceUnderTest, {}, { orderBy: { name: 'asc' } });
      return { items: devices.map(present) };
    },
  }),
  route({
    method: 'post',
    path: '/api/devices',
    access: editors,
    body: createSchema,
    async handler({ em, body, res, deps }) {
      const now = deps.clock.now();
      const device = em.create(DeviceUnderTest, { ...body, createdAt: now, updatedAt: now });
      await em.flush();
      res.status(201);
      return { device: present(device) };
    },
  }),
  route({
    method: 'patch',
    path: '/api/devices/:id',
    access: editors,
    params: idParams,
    body: patchSchema,
    async handler({ em, body, params, deps }) {
      const device = await em.findOne(DeviceUnderTest, { id: params.id });
      if (!device) throw notFound('No such device');
      em.assign(device, { ...body, updatedAt: deps.clock.now() });
      await em.flush();
      return { device: present(device) };
    },
  }),
];
