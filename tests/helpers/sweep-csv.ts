/**
 * An invented frequency-response sweep as CSV (frequencyHz, magnitudeDb): 60 points from 20 Hz to 1 MHz; `shift` dB
 * is added below 100 kHz.
 */
export function sweepCsv(shift = 0): string {
  const lines = ['frequencyHz,magnitudeDb'];
  for (let i = 0; i < 60; i++) {
    const f = 20 * Math.pow(10, (i * 4.7) / 59);
    lines.push(`${f.toFixed(3)},${(-40 - 10 * Math.sin(i / 5) + (f < 100000 ? shift : 0)).toFixed(3)}`);
  }
  return lines.join('\n') + '\n';
}
