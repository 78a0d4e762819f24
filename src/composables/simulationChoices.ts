// The choices of a time-domain run as the pages offer them (labels in words, values of the API).

/** Scenarios of CONTRACT section 10, with what each does. */
export const SCENARIO_CHOICES = [
  { label: 'Steady (R-L load, power factor 0.8)', value: 'steady' },
  { label: 'Reactive step (inductive → capacitive)', value: 'reactive-step' },
  { label: 'Frequency step (to the band edge)', value: 'frequency-step' },
  { label: 'Voltage sag (−10 %)', value: 'voltage-sag' },
];

/** Bridge models. */
export const MODEL_CHOICES = [{ label: 'Averaged', value: 'averaged' }, { label: 'Switched', value: 'switched' }];

/** Harmonic-limit tables. */
export const HARMONIC_TABLE_CHOICES = [
  { label: 'IEEE 519 current distortion', value: 'ieee-519' },
  { label: 'IEC 61000-3-2 class A', value: 'iec-61000-3-2-class-a' },
];
