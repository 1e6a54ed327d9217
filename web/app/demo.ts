/**
 * "Open the demo": one INVENTED scenario per data kind. The values, sites and limits below are made up
 * for trying the app; they describe no real place, product or regulation.
 */
import type { StudySetup } from '../core.ts';
import { isoWithOffset } from '../storage/time.ts';

export interface DemoScenario {
  key: 'measurement' | 'count' | 'pass-fail';
  name: string;
  blurb: string;
  setup: StudySetup;
  values: number[];
  gapMs: number;
}

export function demoScenarios(): DemoScenario[] {
  const today = isoWithOffset().slice(0, 10);
  return [
    {
      key: 'measurement',
      name: 'Demo: nitrate at a spring (invented)',
      blurb: 'Water samples in mg/L; target ± 0.5 mg/L at 95 %. Eight invented readings are in; key in more.',
      setup: {
        kind: 'measurement',
        unit: 'mg/L',
        level: 0.95,
        sided: 'two',
        rule: 'standard',
        min: 10,
        target: { kind: 'margin', value: 0.5 },
        outcomeName: 'nitrate',
      },
      values: [6.2, 5.4, 7.1, 6.8, 5.9, 6.5, 7.4, 6.0],
      gapMs: 95_000,
    },
    {
      key: 'count',
      name: 'Demo: seedlings in 1 m² plots (invented)',
      blurb: 'Oak seedlings counted per plot; target ± 30 % of the mean at 90 %. Ten invented plots are in.',
      setup: {
        kind: 'count',
        unit: '1',
        plotArea: 1,
        plotAreaUnit: 'm2',
        level: 0.9,
        sided: 'two',
        rule: 'standard',
        min: 10,
        target: { kind: 'relative', value: 0.3 },
        outcomeName: 'seedlings',
        // what the Darwin Core tables need, so the demo exports them from the phone
        taxon: 'Quercus robur',
        samplingProtocol: '1 m2 quadrats, every oak seedling under 50 cm counted (invented for the demo)',
      },
      values: [3, 0, 5, 2, 7, 1, 0, 4, 6, 2],
      gapMs: 140_000,
    },
    {
      key: 'pass-fail',
      name: 'Demo: loose fittings in a lot of 400 (invented)',
      blurb: 'Items checked one by one against an invented tolerable rate of 10 %. Twelve items are in.',
      setup: {
        kind: 'pass-fail',
        level: 0.95,
        sided: 'two',
        rule: 'standard',
        min: 10,
        population: 400,
        target: { kind: 'limit', value: 0.1, source: 'invented for the demo', date: today },
        outcomeName: 'loose fitting',
      },
      values: [0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0],
      gapMs: 40_000,
    },
  ];
}
