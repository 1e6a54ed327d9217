/**
 * The one seam between the app and the pure core: this file imports only src/index.ts. web/ takes types
 * from here, and values only through ./core-loader.ts (this module is its own chunk, loaded after the first
 * paint) or, for the few helpers without statistics, ./core-light.ts. Nothing in web/ computes statistics.
 */
export * from '../src/index.ts';
