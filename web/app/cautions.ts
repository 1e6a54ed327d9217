/** The cautions (DESIGN.md): shown at setup (acknowledged), on the report, and in the README. */
export const CAUTIONS: readonly string[] = [
  'The tool gives statistical guidance only. The approved sampling plan, the site safety plan, the regulator’s decision rule, accredited laboratories and licensed professionals take precedence.',
  'Never take one more sample where conditions are unsafe (traffic, confined spaces, water, weather, hazardous material, lone working).',
  'Regulatory limits change: they are entered by you with their source and date, never built in.',
];
