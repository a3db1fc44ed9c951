import { DIST, requireBuild, startNode } from './processes.js';

// The bridge's --help, as a person at the bench reads it: it carries the high-voltage caution, which defers to
// local codes and licensed practice and never says a procedure is safe.
describe('bin/kilocycle bridge --help (real process)', () => {
  beforeAll(() => requireBuild());

  it('should print the usage with the caution and exit 0', async () => {
    const child = startNode(DIST.bridge, ['--help']);
    expect(await child.exited).toBe(0);
    const text = child.stdout();
    expect(text).toMatch(/^Usage: bin\/kilocycle bridge /);
    const caution = text.slice(text.indexOf('Caution:'), text.indexOf('\n\nSources:'));
    expect(caution).toMatch(/^Caution: the equipment under test often holds hundreds of volts/);
    expect(caution.replace(/\s+/g, ' ')).toContain('Follow your local electrical codes and licensed practice');
    expect(caution.replace(/\s+/g, ' ')).toContain('Kilocycle does not judge whether a procedure is safe.');
    expect(text.match(/\bsafe\b/g)).toHaveLength(1);
    expect(Math.max(...text.split('\n').map((line) => line.length))).toBeLessThanOrEqual(110);
  });
});
