// Web only, loaded on demand before the charts: CanvasKit (Skia compiled to WebAssembly). Its
// wasm is a hashed asset of our own build (metro.config.js lists .wasm as an asset), served by our
// server, never fetched from elsewhere. This does what Skia's WithSkiaWeb does, without
// WithSkiaWeb's other imports, which the charts' chunk shares (see plots.ts for why that matters).
import { LoadSkiaWeb } from '@shopify/react-native-skia/lib/module/web/LoadSkiaWeb';

const canvasKitWasm: string = require('canvaskit-wasm/bin/full/canvaskit.wasm');

export function loadCanvasKit(): Promise<void> {
  return LoadSkiaWeb({ locateFile: () => canvasKitWasm });
}
