import { describe, expect, it } from 'vitest';
import { formatQuantity } from './format';
import { parseQuantity } from './parse';

const value = (text: string, dimension: Parameters<typeof parseQuantity>[1]) => {
  const parsed = parseQuantity(text, dimension);
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.value;
};

describe('parseQuantity (SI prefixes, common practice)', () => {
  it('reads values with units and prefixes', () => {
    expect(value('2.2 pF', 'capacitance')).toBeCloseTo(2.2e-12, 24);
    expect(value('50 kHz', 'frequency')).toBe(5e4);
    expect(value('8 nV/rtHz', 'voltageNoiseDensity')).toBeCloseTo(8e-9, 20);
    expect(value('8 nV/√Hz', 'voltageNoiseDensity')).toBeCloseTo(8e-9, 20);
    expect(value('0.3 fF/kPa', 'capacitancePerPressure')).toBeCloseTo(3e-19, 30);
    expect(value('20 uL/s', 'volumeFlow')).toBeCloseTo(2e-8, 20);
    expect(value('20 µL/s', 'volumeFlow')).toBeCloseTo(2e-8, 20);
    expect(value('1 kohm', 'resistance')).toBe(1000);
    expect(value('1.0016 mPa s', 'viscosity')).toBeCloseTo(1.0016e-3, 12);
  });

  it('reads bare numbers with an SI prefix in the SI unit', () => {
    expect(value('2.2p', 'capacitance')).toBeCloseTo(2.2e-12, 24);
    expect(value('2.2 p', 'capacitance')).toBeCloseTo(2.2e-12, 24);
    expect(value('50k', 'frequency')).toBe(5e4);
    expect(value('1e9', 'resistance')).toBe(1e9);
    expect(value('5m', 'voltage')).toBeCloseTo(5e-3, 15);
  });

  it('names the dimension it expected and the one it got', () => {
    expect(parseQuantity('50 kHz', 'capacitance')).toEqual({ ok: false, message: 'expected a capacitance, got a frequency' });
    expect(parseQuantity('3 kg', 'voltage')).toEqual({ ok: false, message: 'expected a voltage, got a quantity in kg' });
    expect(parseQuantity('', 'voltage')).toEqual({ ok: false, message: 'expected a voltage, got nothing' });
    expect(parseQuantity('two volts', 'voltage').ok).toBe(false);
  });
});

describe('formatQuantity (engineering prefixes, common practice)', () => {
  it('puts the prefix on the display unit', () => {
    expect(formatQuantity(2.2e-12, 'capacitance')).toBe('2.2 pF');
    expect(formatQuantity(5e4, 'frequency')).toBe('50 kHz');
    expect(formatQuantity(8e-9, 'voltageNoiseDensity')).toBe('8 nV/rtHz');
    expect(formatQuantity(3e-19, 'capacitancePerPressure')).toBe('300 aF/kPa');
    expect(formatQuantity(2e-8, 'volumeFlow')).toBe('20 uL/s');
    expect(formatQuantity(8e12, 'voltsPerFarad')).toBe('8 mV/fF');
    expect(formatQuantity(999.96, 'voltage')).toBe('1 kV');
    expect(formatQuantity(998, 'massDensity')).toBe('998 kg/m^3');
  });

  it('round-trips through the parser', () => {
    for (const v of [4.7e-15, 1.5e-12, 3.3e-9, 0.25, 12, 6.8e3, 1e9]) {
      expect(value(formatQuantity(v, 'capacitance', { significant: 6 }), 'capacitance')).toBeCloseTo(v, 12 - Math.floor(Math.log10(v)));
    }
  });
});
