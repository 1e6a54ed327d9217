/**
 * A QR code (ISO/IEC 18004) drawn as one SVG path from the `uqr` encoder's module matrix: no markup from
 * elsewhere is injected, and the dark modules are plain path squares, so it scans off a sunlit screen.
 */
import { encode } from 'uqr';

export function CrewQr({ text, label }: { text: string; label: string }) {
  const { data, size } = encode(text, { border: 2 });
  let d = '';
  data.forEach((row, y) => {
    row.forEach((dark, x) => {
      if (dark) d += `M${x} ${y}h1v1h-1z`;
    });
  });
  return (
    <svg
      class="crew-qr"
      role="img"
      aria-label={label}
      viewBox={`0 0 ${size} ${size}`}
      width="200"
      height="200"
      shape-rendering="crispEdges"
      data-testid="crew-qr"
    >
      <rect width={size} height={size} fill="#fff" />
      <path d={d} fill="#000" />
    </svg>
  );
}
