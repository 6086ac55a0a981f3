const INK = 'var(--color-ink)';
const SOFT = 'var(--color-ink-soft)';
const ARM = 'var(--color-brand)';
const FAULT = 'var(--color-fail)';

/** A resistor drawn as a zigzag between two points on a vertical or diagonal run. */
function zigzag(x1: number, y1: number, x2: number, y2: number, teeth = 6, width = 5): string {
  const dx = x2 - x1;
  const dy = y2 - y1;
  const len = Math.hypot(dx, dy);
  const [ux, uy] = [dx / len, dy / len];
  const [nx, ny] = [-uy, ux];
  const lead = len * 0.25;
  const body = len - 2 * lead;
  const points: string[] = [`${x1},${y1}`, `${x1 + ux * lead},${y1 + uy * lead}`];
  for (let i = 0; i < teeth; i++) {
    const t = lead + (body * (i + 0.5)) / teeth;
    const side = i % 2 === 0 ? width : -width;
    points.push(`${x1 + ux * t + nx * side},${y1 + uy * t + ny * side}`);
  }
  points.push(`${x1 + ux * (len - lead)},${y1 + uy * (len - lead)}`, `${x2},${y2}`);
  return points.join(' ');
}

function Earth({ x, y }: { x: number; y: number }) {
  return (
    <g stroke={INK} strokeWidth={1.5}>
      <line x1={x - 9} y1={y} x2={x + 9} y2={y} />
      <line x1={x - 6} y1={y + 4} x2={x + 6} y2={y + 4} />
      <line x1={x - 3} y1={y + 8} x2={x + 3} y2={y + 8} />
    </g>
  );
}

/**
 * How the Murray loop is wired, so the two bridge arms cannot be swapped by mistake: the faulted
 * arm on the faulted line, the sound arm on the sound line, the two lines joined at the far end,
 * the supply from the arms' junction to earth, the detector between the two lines.
 */
export function MurraySketch({ faultedLine, soundLine }: { faultedLine?: string | undefined; soundLine?: string | undefined }) {
  const faulted = faultedLine ? `faulted line (${faultedLine})` : 'faulted line';
  const sound = soundLine ? `sound line (${soundLine})` : 'sound line';
  const label = `Wiring of the Murray loop: the bridge arm on the ${faulted} and the bridge arm on the ${sound} meet at one point; the supply goes from there to earth (line C or the screen); the detector sits between the two lines at the near end; the two lines are joined at the far end; the fault leaks from the faulted line to earth.`;
  const [yTop, yBottom, xNear, xFar, xJ] = [38, 108, 118, 336, 40];
  return (
    <figure className="rounded-lg border border-line bg-paper p-2">
      <svg viewBox="0 0 360 175" role="img" aria-label={label} className="h-auto w-full max-w-md" fontSize={10} fontFamily="inherit">
        <text x={xNear} y={10} textAnchor="middle" fill={SOFT}>
          near end
        </text>
        <text x={xFar} y={10} textAnchor="end" fill={SOFT}>
          far end
        </text>
        {/* the two lines of the cable and the far-end link */}
        <line x1={xNear} y1={yTop} x2={xFar} y2={yTop} stroke={INK} strokeWidth={2.5} />
        <line x1={xNear} y1={yBottom} x2={xFar} y2={yBottom} stroke={INK} strokeWidth={2.5} />
        <line x1={xFar} y1={yTop} x2={xFar} y2={yBottom} stroke={INK} strokeWidth={2.5} strokeDasharray="5 3" />
        <text x={xNear + 60} y={yTop - 8} fill={INK}>
          {faulted}
        </text>
        <text x={xNear + 60} y={yBottom + 16} fill={INK}>
          {sound}
        </text>
        <text x={xFar - 4} y={(yTop + yBottom) / 2 - 4} textAnchor="end" fill={SOFT}>
          joined at
        </text>
        <text x={xFar - 4} y={(yTop + yBottom) / 2 + 8} textAnchor="end" fill={SOFT}>
          the far end
        </text>
        {/* the fault from the faulted line to earth */}
        <polyline points={zigzag(250, yTop, 250, yTop + 34, 4, 4)} fill="none" stroke={FAULT} strokeWidth={1.5} />
        <Earth x={250} y={yTop + 36} />
        <text x={262} y={yTop + 30} fill={FAULT}>
          fault
        </text>
        {/* the arms from their junction to the two lines */}
        <polyline points={zigzag(xJ, (yTop + yBottom) / 2, xNear, yTop)} fill="none" stroke={ARM} strokeWidth={2} />
        <polyline points={zigzag(xJ, (yTop + yBottom) / 2, xNear, yBottom)} fill="none" stroke={ARM} strokeWidth={2} />
        <text x={44} y={yTop - 6} fill={ARM} fontWeight={600}>
          faulted arm
        </text>
        <text x={58} y={yBottom + 10} fill={ARM} fontWeight={600}>
          sound arm
        </text>
        <circle cx={xJ} cy={(yTop + yBottom) / 2} r={2.5} fill={INK} />
        {/* the detector between the two lines at the near end */}
        <line x1={xNear} y1={yTop} x2={xNear} y2={yBottom} stroke={INK} strokeWidth={1.2} />
        <circle cx={xNear} cy={(yTop + yBottom) / 2} r={10} fill="var(--color-card)" stroke={INK} strokeWidth={1.5} />
        <text x={xNear} y={(yTop + yBottom) / 2 + 3.5} textAnchor="middle" fill={INK} fontWeight={600}>
          0
        </text>
        <text x={xNear + 14} y={(yTop + yBottom) / 2 + 3.5} fill={SOFT}>
          detector
        </text>
        {/* the supply from the junction to earth */}
        <line x1={xJ} y1={(yTop + yBottom) / 2} x2={xJ} y2={122} stroke={INK} strokeWidth={1.2} />
        <line x1={xJ - 9} y1={122} x2={xJ + 9} y2={122} stroke={INK} strokeWidth={2} />
        <line x1={xJ - 5} y1={127} x2={xJ + 5} y2={127} stroke={INK} strokeWidth={2} />
        <line x1={xJ} y1={127} x2={xJ} y2={140} stroke={INK} strokeWidth={1.2} />
        <Earth x={xJ} y={140} />
        <text x={xJ + 14} y={130} fill={SOFT}>
          supply to earth (line C)
        </text>
      </svg>
      <figcaption className="mt-1 text-xs text-ink-soft">
        At balance the detector reads 0: read the arm on the {faulted} and the arm on the {sound}.
      </figcaption>
    </figure>
  );
}
