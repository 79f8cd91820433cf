/** What routes compose from the model-profile feature. */
export { ModelsTable } from "./components/models-table";
export { ProfileDetail } from "./components/profile-detail";
export { ImportConfig } from "./components/import-config";
export { ImportWarnings } from "./components/import-warnings";
export { NewProfile } from "./components/new-profile";
export { canEditProfiles } from "./can-edit";
