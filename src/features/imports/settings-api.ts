import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { calibrationFamilySchema, settingsListSchema, type FamilySettings } from '#shared/api/settings';
import { api } from '../../lib/api';

export const settingsQuery = queryOptions({ queryKey: ['settings'], queryFn: () => api('/settings', { schema: settingsListSchema }) });
export const saveSettings = (productType: string, s: FamilySettings): Promise<FamilySettings> => api(`/settings/${productType}`, { method: 'PUT', body: s });
export const calibrationQuery = queryOptions({ queryKey: ['calibration'], queryFn: () => api('/calibration', { schema: z.array(calibrationFamilySchema) }) });
export const adoptFactor = (productType: string, growthFactor: number, growthFactorSd: number): Promise<void> =>
  api('/calibration/adopt', { method: 'POST', body: { productType, growthFactor, growthFactorSd } });
