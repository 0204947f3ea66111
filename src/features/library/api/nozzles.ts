import { nozzleSchema, type NozzleInput } from '../../../../shared/schemas/library.schema';
import { namedResource } from './crud';

const nozzles = namedResource<typeof nozzleSchema, NozzleInput>('/library/nozzles', 'nozzles', nozzleSchema);
export const getNozzles = nozzles.fetchAll;
export const nozzlesQueryOptions = nozzles.queryOptions;
export const useNozzles = nozzles.useList;
export const useCreateNozzle = nozzles.useCreate;
export const useUpdateNozzle = nozzles.useUpdate;
export const useDeleteNozzle = nozzles.useDelete;
