import { queryOptions, useQuery } from '@tanstack/react-query';
import { http } from '../../lib/http';
import type { OutboxPage } from '../../../shared/schemas/outbox';

export const outboxKeys = { all: ['outbox'] as const, page: (page: number) => ['outbox', page] as const };

export const fetchOutbox = (page = 1) => http<OutboxPage>(`/api/outbox?page=${page}`);
export const outboxQuery = (page = 1) =>
  queryOptions({ queryKey: outboxKeys.page(page), queryFn: () => fetchOutbox(page), retry: false });
export const useOutbox = (page = 1) => useQuery(outboxQuery(page));
