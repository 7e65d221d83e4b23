// Every Signals screen (and Settings → Collection targets), in one module. Route files reach it
// only through lazy-screens.tsx, so on the web the Signals place is one chunk loaded on its first
// visit rather than part of the first page load. (One chunk, not one per screen: the web build
// moves whatever two lazy chunks share into the chunk every page loads first.)
export { ServicesScreen } from './services/services-screen';
export { SignalExplorerScreen } from './explorer/explorer-screen';
export { CsvUploadScreen } from './csv/csv-upload-screen';
export { CollectionTargetsScreen } from '../settings/collection-targets/collection-targets-screen';
