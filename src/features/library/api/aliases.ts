import { aliasSchema, type AliasInput } from '../../../../shared/schemas/library.schema';
import { namedResource } from './crud';

const aliases = namedResource<typeof aliasSchema, AliasInput>('/library/aliases', 'aliases', aliasSchema);
export const getAliases = aliases.fetchAll;
export const aliasesQueryOptions = aliases.queryOptions;
export const useAliases = aliases.useList;
export const useCreateAlias = aliases.useCreate;
export const useUpdateAlias = aliases.useUpdate;
export const useDeleteAlias = aliases.useDelete;
