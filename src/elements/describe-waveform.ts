/** Units of the numeric fields of the waveform specs; `signal` is V or A by the source. */
const WAVEFORM_FIELD_UNITS: Readonly<Record<string, string>> = {
  amplitude: 'signal', offset: 'signal', value: 'signal', low: 'signal', high: 'signal',
  frequency: 'Hz', phase: 'rad', period: 's', start: 's', delay: 's', rise: 's', fall: 's', deadTime: 's', width: 's',
};

/**
 * A waveform spec in one line for listings: its kind and its scalar fields,
 * numbers to 4 significant digits with their units (`signalUnit` for the
 * source's own quantity: V or A).
 *
 * @example
 * ```ts
 * describeWaveform(sine({ amplitude: 325.2691193458119, frequency: 50 }), 'V'); // 'sine (amplitude 325.3 V, frequency 50 Hz, ...)'
 * ```
 */
export function describeWaveform(w: { readonly kind: string }, signalUnit: string): string {
  const parts = Object.entries(w as Record<string, unknown>)
    .filter(([k, v]) => k !== 'kind' && (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean'))
    .map(([k, v]) => {
      if (typeof v !== 'number') return `${k} ${String(v)}`;
      const unit = WAVEFORM_FIELD_UNITS[k];
      const u = unit === 'signal' ? signalUnit : unit;
      return `${k} ${String(Number(v.toPrecision(4)))}${u ? ` ${u}` : ''}`;
    });
  return `${w.kind}${parts.length ? ` (${parts.join(', ')})` : ''}`;
}
