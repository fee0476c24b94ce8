import { queryOptions } from '@tanstack/react-query';
import { get, set } from 'idb-keyval';
import { yardPackSchema, type YardPack } from '#shared/api/yard';
import { api, ApiFailure } from '../../lib/api';

const STORE_KEY = 'cw-yard-pack';

/**
 * The yard pack, network first: every successful fetch is kept in IndexedDB, and when the tablet has
 * no connection the last kept pack answers instead, so finding pieces and checking readings work offline.
 */
export const yardPackQuery = queryOptions({
  queryKey: ['yard', 'pack'],
  queryFn: async (): Promise<YardPack & { offline: boolean }> => {
    try {
      const pack = await api('/yard/pack', { schema: yardPackSchema });
      await set(STORE_KEY, pack);
      return { ...pack, offline: false };
    } catch (e) {
      if (e instanceof ApiFailure && e.status === 0) {
        const kept = yardPackSchema.safeParse(await get(STORE_KEY));
        if (kept.success) return { ...kept.data, offline: true };
      }
      throw e;
    }
  },
  staleTime: 60_000,
  networkMode: 'always',
});

/** Marks compare without spaces, dashes or case: "dt 104", "DT-104" and "dt104" are one mark. */
export const markKey = (s: string): string => s.toLowerCase().replace(/[^a-z0-9]/g, '');
