import { colourOf } from './chart-look';

/** Which colour is which session, under a chart (its own legend is off: two lines per band). */
export function SessionLegend({ names, colours }: { names: string[]; colours?: string[] }) {
  return (
    <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="Legend">
      {names.map((name, i) => (
        <li key={name} className="flex items-center gap-1.5">
          <span className="inline-block h-2 w-4 rounded-sm" style={{ background: colours?.[i] ?? colourOf(i) }} aria-hidden />
          {name}
        </li>
      ))}
    </ul>
  );
}
