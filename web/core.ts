/**
 * The one seam between the app and the pure core: web/ imports statistics and shared types from here,
 * and this file imports only src/index.ts. Nothing in web/ computes statistics itself.
 */
export * from '../src/index.ts';
