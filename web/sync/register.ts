/** Puts "Join a crew" on the studies screen (import once, from web/main.tsx). */

import { CrewJoin } from '../app/components/crew-join.tsx';
import { studiesSlots } from '../app/slots.ts';

if (!studiesSlots.includes(CrewJoin)) studiesSlots.push(CrewJoin);
