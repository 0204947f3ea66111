import { machineSchema, type MachineInput } from '../../../../shared/schemas/library.schema';
import { namedResource } from './crud';

const machines = namedResource<typeof machineSchema, MachineInput>('/library/machines', 'machines', machineSchema);
export const getMachines = machines.fetchAll;
export const machinesQueryOptions = machines.queryOptions;
export const useMachines = machines.useList;
export const useCreateMachine = machines.useCreate;
export const useUpdateMachine = machines.useUpdate;
export const useDeleteMachine = machines.useDelete;
