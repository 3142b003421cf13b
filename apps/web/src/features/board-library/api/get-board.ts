import { boardDetailSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A board model's newest version (or `version`) with its expected-readings table (computed by the server from the netlist). */
export const getBoard = (id: string, version?: number) =>
  api(`/boards/${encodeURIComponent(id)}${version ? `?version=${version}` : ''}`, { schema: boardDetailSchema });
export const getBoardQueryOptions = (id: string, version?: number) =>
  queryOptions({ queryKey: version ? ['boards', id, version] : ['boards', id], queryFn: () => getBoard(id, version) });
export const useBoard = (id: string, version?: number) => useQuery(getBoardQueryOptions(id, version));
