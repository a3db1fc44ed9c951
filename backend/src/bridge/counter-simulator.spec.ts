import { CounterSimulator, IDN } from './counter-simulator.js';
import { parseScpiNumber } from './oscillator-model.js';

describe('CounterSimulator', () => {
  const sim = new CounterSimulator({ profile: 'stable', speed: 1, freqMinHz: 3_500_000, freqMaxHz: 7_500_000, dialKHz: 7050, seed: 2 });

  describe('answer()', () => {
    it('should identify itself', () => {
      expect(sim.answer('*IDN?')).toBe(IDN);
    });

    it.each(['MEAS:FREQ?', ':MEASure:FREQuency?', 'meas:freq? DEF,DEF', 'READ?', 'FETC?', 'FETCH?', 'MEAS?', 'MEAS:SCAL:FREQ?'])(
      'should answer %s with a frequency',
      (query) => {
        const value = parseScpiNumber(sim.answer(query) ?? '');
        expect(value).not.toBeNull();
        expect(Math.abs(value! - 7_050_000)).toBeLessThan(20_000);
      },
    );

    it('should answer each query of a compound message and stay silent on settings', () => {
      expect(sim.answer('*RST;CONF:FREQ')).toBeNull();
      const replies = sim.answer('*IDN?;READ?')!.split(';');
      expect(replies).toHaveLength(2);
      expect(replies[0]).toBe(IDN);
    });

    it('should report an unknown header in SYST:ERR? and answer nothing to it', () => {
      expect(sim.answer('FREQ:WHAT?')).toBeNull();
      expect(sim.answer('SYST:ERR?')).toBe('-113,"Undefined header"');
      expect(sim.answer('SYST:ERR?')).toBe('+0,"No error"');
    });
  });
});
