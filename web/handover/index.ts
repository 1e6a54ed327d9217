/** Registers the hand-over features in the app's mount points (import this module once, from main.tsx). */
import { reportSlots, studiesSlots } from '../app/slots.ts';
import { ImportPanel } from './import-panel.tsx';
import { HandoverPanel } from './panel.tsx';

if (!reportSlots.includes(HandoverPanel)) reportSlots.push(HandoverPanel);
if (!studiesSlots.includes(ImportPanel)) studiesSlots.push(ImportPanel);
