import { SerialPortMock } from 'serialport';
import type { AttachAck } from '@kilocycle/common/events';
import type { Captured } from './counter-source.js';
import { parseSerialAddress, SerialSource, type SerialPortLike } from './serial-source.js';

const attach = {
  ok: true,
  runId: 1,
  lastSeq: 0,
  kind: 'warmup',
  dataKind: 'frequency',
  startedAt: new Date().toISOString(),
  benchId: 1,
  benchName: 'Bench 1',
  range: { label: 'A', dialUnit: 'kHz', dialMin: 3500, dialMax: 7500, freqMinHz: 3.5e6, freqMaxHz: 7.5e6 },
} satisfies AttachAck;

/** A serial port simulated by serialport's own mock binding. */
function mockPort(path: string, answer?: (command: string) => string | null) {
  SerialPortMock.binding.createPort(path, { echo: false, record: true });
  let port: SerialPortMock | null = null;
  const factory = async (): Promise<SerialPortLike> => {
    port = new SerialPortMock({ path, baudRate: 9600, autoOpen: false });
    port.once('open', () => {
      const binding = port!.port!;
      const write = binding.write.bind(binding);
      binding.write = async (buffer: Buffer) => {
        await write(buffer);
        const reply = answer?.(buffer.toString('latin1').trim());
        if (reply !== null && reply !== undefined) setTimeout(() => binding.emitData(Buffer.from(reply + '\r\n')), 2);
      };
    });
    return port;
  };
  return { factory, device: () => port!.port! };
}

/** Waits until `done()` holds, checking every 10 ms; a loaded machine may take far longer than the readings' interval. */
async function until(done: () => boolean, what: string, limitMs = 10_000): Promise<void> {
  const deadline = Date.now() + limitMs;
  while (!done()) {
    if (Date.now() > deadline) throw new Error(`gave up waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 10));
  }
}

describe('SerialSource', () => {
  afterEach(() => SerialPortMock.binding.reset());

  it('should listen to a counter that sends readings by itself, skipping lines that hold none', async () => {
    const { factory, device } = mockPort('/dev/ttyMOCK0');
    const source = new SerialSource(parseSerialAddress('serial:/dev/ttyMOCK0?baud=9600'), { intervalMs: 100, timeoutMs: 500 }, factory);
    const got: Captured[] = [];
    const warnings: string[] = [];
    let opened = false;
    const running = source.run((r) => got.push(r), { attach, warn: (m) => warnings.push(m) });
    await until(() => {
      try {
        opened = device().isOpen;
      } catch {
        opened = false;
      }
      return opened;
    }, 'the port to open');
    device().emitData(Buffer.from('+7.05001234E+06\r\nF 7.05 MHz\r\n5500,7050100\r\ngarbage\r\n'));
    await until(() => warnings.some((w) => w.includes('garbage')), 'the last line to be read');
    source.stop();
    await running;
    expect(got).toEqual([{ frequency: 7_050_012.34 }, { dial: 5500, frequency: 7_050_100 }]);
    expect(source.skipped).toBe(2);
    expect(warnings.join('\n')).toContain('serial line "garbage" skipped');
  });

  it('should ask with the query and read each answer', async () => {
    const { factory, device } = mockPort('/dev/ttyMOCK1', (command) => (command === 'FETC?' ? '+7.04999876E+06' : null));
    const source = new SerialSource(parseSerialAddress('serial:/dev/ttyMOCK1?baud=4800&query=FETC?'), { intervalMs: 10, timeoutMs: 500, dial: 7050 }, factory);
    const got: Captured[] = [];
    const running = source.run((r) => got.push(r), { attach, warn: () => undefined });
    await until(() => got.length >= 3, 'three answers');
    source.stop();
    await running;
    expect(got.length).toBeGreaterThanOrEqual(3);
    expect(got[0]).toEqual({ dial: 7050, frequency: 7_049_998.76 });
    expect(device().recording.toString()).toMatch(/^(FETC\?\n)+$/);
  });
});
