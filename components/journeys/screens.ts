// Every Journeys screen, in one module. Route files reach it only through lazy-screens.tsx, so on
// the web the Journeys place is one chunk loaded on its first visit rather than part of the first
// page load. (One chunk, not one per screen: the web build moves whatever two lazy chunks share
// into the chunk every page loads first.)
export { JourneysScreen } from './list/journeys-screen';
export { JourneyDetailScreen } from './detail/journey-detail-screen';
export { RunDetailScreen } from './run/run-detail-screen';
export { JourneyEditorScreen } from './editor/journey-editor-screen';
export { HarImportScreen } from './har/har-import-screen';
