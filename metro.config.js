// Metro: default Expo config plus .wasm as an asset, so CanvasKit (charts) ships as a hashed file.
const { getDefaultConfig } = require('expo/metro-config');
const config = getDefaultConfig(__dirname);
config.resolver.assetExts.push('wasm');
// Server, worker and tests never reach the bundle.
config.resolver.blockList = [/\/\.data\/.*/, /\/tests\/.*/, /\/server\/.*/, /\/worker\/.*/, /\/bench\/.*/];
module.exports = config;
