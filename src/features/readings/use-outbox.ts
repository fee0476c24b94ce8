import { useSyncExternalStore } from 'react';
import { snapshot, subscribe, type OutboxState } from './outbox';

export const useOutbox = (): OutboxState => useSyncExternalStore(subscribe, snapshot);
