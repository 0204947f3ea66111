import { visionPresetSchema, type VisionPresetInput } from '../../../../shared/schemas/library.schema';
import { namedResource } from './crud';

const presets = namedResource<typeof visionPresetSchema, VisionPresetInput>('/library/vision-presets', 'vision-presets', visionPresetSchema);
export const getVisionPresets = presets.fetchAll;
export const visionPresetsQueryOptions = presets.queryOptions;
export const useVisionPresets = presets.useList;
export const useCreateVisionPreset = presets.useCreate;
export const useUpdateVisionPreset = presets.useUpdate;
export const useDeleteVisionPreset = presets.useDelete;
