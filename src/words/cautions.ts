/**
 * The one cautions text: acknowledged at setup, shown on the phone's report and printed in the report file.
 * The README's "Cautions" section says the same.
 */
export const CAUTIONS: readonly string[] = [
  'The tool gives statistical guidance only. The approved sampling plan, the site safety plan, the regulator’s decision rule, accredited laboratories and licensed professionals take precedence.',
  'Never take one more sample where conditions are unsafe (traffic, confined spaces, water, weather, hazardous material, lone working).',
  'Regulatory limits change: they are entered by the user with their source and date, never built in.',
  '“More needed” is a statistical projection, not an instruction to continue.',
];
