import { boardDetailSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A board model's newest version with its expected-readings table (computed by the server from the netlist). */
export const getBoard = (id: string) => api(`/boards/${encodeURIComponent(id)}`, { schema: boardDetailSchema });
export const getBoardQueryOptions = (id: string) => queryOptions({ queryKey: ['boards', id], queryFn: () => getBoard(id) });
export const useBoard = (id: string) => useQuery(getBoardQueryOptions(id));
