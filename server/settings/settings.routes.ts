import { z } from 'zod';
import { adoptSchema, calibrationFamilySchema, familySettingsSchema, settingsListSchema } from '#shared/api/settings';
import { productTypeSchema } from '#shared/camber/schema';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { adoptFactor, calibrationView, listSettings, saveSettings } from './settings.service';

const OFFICE = ['qc_manager', 'engineer', 'admin'] as const;
const ENGINEERS = ['engineer', 'admin'] as const;

export function settingsRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({ method: 'get', path: '/settings', summary: 'Model and tolerance settings per product family', roles: OFFICE, response: settingsListSchema, handler: ({ user }) => listSettings(d, user) }),
    defineRoute({
      method: 'put', path: '/settings/:productType', summary: 'Change the settings of a product family (re-runs the projections)', roles: ENGINEERS,
      params: z.object({ productType: productTypeSchema }), body: familySettingsSchema, response: familySettingsSchema,
      handler: ({ user, params, body }) => saveSettings(d, user, params.productType, body),
    }),
    defineRoute({ method: 'get', path: '/calibration', summary: 'Measured ÷ predicted by product family and age, with the fitted factor', roles: OFFICE, response: z.array(calibrationFamilySchema), handler: ({ user }) => calibrationView(d, user) }),
    defineRoute({
      method: 'post', path: '/calibration/adopt', summary: 'Adopt a growth factor for a product family (future predictions use it)', roles: ENGINEERS, body: adoptSchema,
      handler: ({ user, body }) => adoptFactor(d, user, body.productType, body.growthFactor, body.growthFactorSd),
    }),
  ];
}
