/** The crew server's protocol, crew codes and the crew view (see README.md). */
export {
  CREW_CODE_ALPHABET,
  CREW_CODE_LENGTH,
  formatCrewCode,
  newCrewCode,
  normalizeCrewCode,
} from './crew-code.ts';
export { type CrewView, crewView } from './crew-view.ts';
export * from './protocol.ts';
