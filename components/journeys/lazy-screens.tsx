import { lazyScreens } from '../ui/lazy-screens';

// The screens the routes render; each loads the Journeys chunk the first time one is shown.
const lazyScreen = lazyScreens(() => import('./screens'), 'Opening Journeys…');
export const JourneysScreen = lazyScreen('JourneysScreen');
export const JourneyDetailScreen = lazyScreen('JourneyDetailScreen');
export const RunDetailScreen = lazyScreen('RunDetailScreen');
export const JourneyEditorScreen = lazyScreen('JourneyEditorScreen');
export const HarImportScreen = lazyScreen('HarImportScreen');
