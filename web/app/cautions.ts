/** The cautions: the one text of src/words (the report file prints the same). */
export { CAUTIONS } from '../core-light.ts';
