import { THIN } from '../../lib/units';

/**
 * Approximate sRGB of a spectral colour (piecewise linear over 380–750 nm with dimming at the ends),
 * after D. Bruton, "Approximate RGB values for visible wavelengths" (1996).
 */
function spectralRgb(nm: number): [number, number, number] {
  let r = 0;
  let g = 0;
  let b = 0;
  if (nm < 440) [r, g, b] = [(440 - nm) / 60, 0, 1];
  else if (nm < 490) [r, g, b] = [0, (nm - 440) / 50, 1];
  else if (nm < 510) [r, g, b] = [0, 1, (510 - nm) / 20];
  else if (nm < 580) [r, g, b] = [(nm - 510) / 70, 1, 0];
  else if (nm < 645) [r, g, b] = [1, (645 - nm) / 65, 0];
  else [r, g, b] = [1, 0, 0];
  const edge = nm < 420 ? 0.3 + (0.7 * (nm - 380)) / 40 : nm > 700 ? 0.3 + (0.7 * (750 - nm)) / 50 : 1;
  return [r, g, b].map((c) => Math.round(255 * c * edge)) as [number, number, number];
}

function bandName(nm: number): string {
  if (nm < 380) return 'UV';
  if (nm <= 1400) return 'near IR';
  if (nm <= 3000) return 'short-wave IR';
  return 'IR';
}

/** A wavelength with a chip tinted like its light; outside the visible band a striped chip with the band's name, so 1064 nm never looks red. */
export function WavelengthChip({ nm }: { nm: number }) {
  const visible = nm >= 380 && nm <= 750;
  const [r, g, b] = visible ? spectralRgb(nm) : [0, 0, 0];
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap">
      <span
        aria-hidden="true"
        className="inline-block h-3 w-3 rounded-full border border-rule-strong"
        style={
          visible
            ? { background: `rgb(${r} ${g} ${b})` }
            : { background: 'repeating-linear-gradient(45deg, #6b7690 0 2px, #fdfcf9 2px 4px)' }
        }
      />
      <span className="num">
        {Number(nm.toPrecision(6))}
        {THIN}nm
      </span>
      {!visible && <span className="text-2xs text-ink-faint">{bandName(nm)}</span>}
    </span>
  );
}
