import { lazyScreens } from '../ui/lazy-screens';

// The screens the routes render; each loads the Signals chunk the first time one is shown.
const lazyScreen = lazyScreens(() => import('./signals-screens'), 'Opening Signals…');
export const ServicesScreen = lazyScreen('ServicesScreen');
export const SignalExplorerScreen = lazyScreen('SignalExplorerScreen');
export const CsvUploadScreen = lazyScreen('CsvUploadScreen');
export const CollectionTargetsScreen = lazyScreen('CollectionTargetsScreen');
