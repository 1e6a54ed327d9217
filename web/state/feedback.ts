/** A short vibration and a distinct tone when the verdict changes (each can be switched off). */
import type { VerdictStatus } from '../core.ts';
import { settings } from './app-state.ts';

let ctx: AudioContext | null = null;

/** Rising two-note chime for a decision, one low note when it falls back to "keep going". */
const TONES: Record<VerdictStatus, number[]> = {
  enough: [660, 990],
  'below limit': [660, 990],
  'above limit': [990, 660, 990],
  'keep going': [330],
};

function tone(freqs: number[]): void {
  try {
    ctx ??= new AudioContext();
    const c = ctx;
    let t = c.currentTime + 0.02;
    for (const f of freqs) {
      const osc = c.createOscillator();
      const gain = c.createGain();
      osc.type = 'triangle';
      osc.frequency.value = f;
      gain.gain.setValueAtTime(0.0001, t);
      gain.gain.exponentialRampToValueAtTime(0.4, t + 0.02);
      gain.gain.exponentialRampToValueAtTime(0.0001, t + 0.18);
      osc.connect(gain).connect(c.destination);
      osc.start(t);
      osc.stop(t + 0.2);
      t += 0.2;
    }
  } catch {
    /* no audio on this device */
  }
}

/** Counts how often the verdict-change signal fired (read by the browser tests). */
export let verdictSignals = 0;

export function signalVerdictChange(to: VerdictStatus): void {
  verdictSignals++;
  document.documentElement.dataset.verdictSignals = String(verdictSignals);
  const s = settings.get();
  if (s.vibrate && 'vibrate' in navigator) navigator.vibrate(to === 'keep going' ? 120 : [90, 60, 90]);
  if (s.sound) tone(TONES[to]);
}
