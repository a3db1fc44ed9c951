import { numberReading, parseReadingLine } from './counter-source.js';
import { parseScpiAddress } from './scpi-source.js';
import { parseSerialAddress } from './serial-source.js';

describe('parseReadingLine()', () => {
  it.each([
    ['7050000', { frequency: 7_050_000 }],
    ['  7.050 MHz ', { frequency: 7_050_000 }],
    ['1735 kHz', { frequency: 1_735_000 }],
    ['4000,7050000', { dial: 4000, frequency: 7_050_000 }],
    ['4000;7.05 MHz', { dial: 4000, frequency: 7_050_000 }],
    ['4000\t7050000', { dial: 4000, frequency: 7_050_000 }],
    ['7 050 000', { frequency: 7_050_000 }],
  ])('should read %p', (line, reading) => {
    expect(parseReadingLine(line)).toEqual(reading);
  });

  it.each(['', '   ', '# a comment'])('should skip %p', (line) => {
    expect(parseReadingLine(line)).toBeNull();
  });

  it.each([
    ['bad', /not a frequency/],
    ['-7050000', /not a frequency/],
    ['x,7050000', /not a dial setting/],
    ['1,2,3', /3 fields/],
    ['NaN', /not a frequency/],
  ])('should refuse %p with a reason', (line, reason) => {
    expect(() => parseReadingLine(line)).toThrow(reason);
  });
});

// A phase run's lines are time intervals: SI submultiples of the second (1 ns = 1e-9 s), either sign.
describe('parseReadingLine() in a phase run', () => {
  it('should read a time interval, with or without a unit and a dial', () => {
    expect(parseReadingLine('-2.5e-9', 'phase')).toEqual({ timeInterval: -2.5e-9 });
    expect(parseReadingLine('12.5 ns', 'phase')!.timeInterval).toBeCloseTo(12.5e-9, 20);
    expect(parseReadingLine('4000,0.001', 'phase')).toEqual({ dial: 4000, timeInterval: 0.001 });
  });

  it('should refuse a frequency in a phase run, naming a time interval', () => {
    expect(() => parseReadingLine('7.05 MHz', 'phase')).toThrow(/"7.05 MHz" is not a time interval \(unknown unit 'MHz'/);
  });

  it('should take a bare number from the counter as a reading of the run kind', () => {
    expect(numberReading('phase', -3e-9)).toEqual({ timeInterval: -3e-9 });
    expect(numberReading('frequency', 7e6)).toEqual({ frequency: 7e6 });
    expect(numberReading('frequency', -1)).toBeNull();
    expect(numberReading('phase', null)).toBeNull();
  });
});

describe('source addresses', () => {
  it('should read SCPI addresses, with 5025 as the default port', () => {
    expect(parseScpiAddress('scpi://counter.lab:5025')).toEqual({ host: 'counter.lab', port: 5025 });
    expect(parseScpiAddress('scpi://10.0.0.7')).toEqual({ host: '10.0.0.7', port: 5025 });
    expect(parseScpiAddress('scpi://[::1]:5555')).toEqual({ host: '::1', port: 5555 });
    expect(() => parseScpiAddress('scpi://host:99999')).toThrow('not a TCP port');
    expect(() => parseScpiAddress('tcp://host')).toThrow('not a SCPI address');
  });

  it('should read serial addresses and their line settings', () => {
    expect(parseSerialAddress('serial:/dev/ttyUSB0?baud=9600')).toEqual({
      path: '/dev/ttyUSB0',
      baudRate: 9600,
      dataBits: 8,
      parity: 'none',
      stopBits: 1,
      query: null,
    });
    expect(parseSerialAddress('serial:/dev/ttyS1?baud=4800&bits=7&parity=even&stop=2&query=FETC?')).toMatchObject({
      baudRate: 4800,
      dataBits: 7,
      parity: 'even',
      stopBits: 2,
      query: 'FETC?',
    });
    expect(() => parseSerialAddress('serial:/dev/ttyUSB0?speed=9600')).toThrow('unknown serial setting "speed"');
    expect(() => parseSerialAddress('serial:/dev/ttyUSB0?parity=mark')).toThrow('parity');
  });
});
