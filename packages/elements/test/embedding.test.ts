// The README's embedding examples, loaded as written from a plain static file server (node:http,
// no dev-server module resolution, no injected import map): packages/elements/examples/plain.html
// imports the one-file bundles by relative URL; examples/import-map.html maps the bare names of the
// per-module build. Each must render data in its elements, with no console or page error.
import { expect } from '@open-wc/testing';
import { executeServerCommand } from '@web/test-runner-commands';

interface Shown {
  importMap: boolean;
  defined: string[];
  budgetRows: number;
  budgetTotal: string | null;
  budgetCaution: string | null;
  scheduleRows: number;
  scheduleLabel: string | null;
  stabilityLabel: string | null;
  reviewEntries: number;
  alerts: string[];
  errors: string[];
  url: string;
}

const open = (path: string, screenshot?: string): Promise<Shown> =>
  executeServerCommand<Shown, Record<string, unknown>>('tauline-static-page', {
    path,
    width: 1000,
    height: 1400,
    screenshot,
  });

describe('embedding without a bundler (static server)', () => {
  it('examples/plain.html registers all four tags from the bundle and every element shows SDK data, with no error', async () => {
    const shown = await open('/packages/elements/examples/plain.html', '.ci-out/embed-plain.png');
    expect(shown.errors).to.deep.equal([]);
    expect(shown.importMap).to.equal(false);
    expect(shown.defined.length).to.equal(4);
    expect(shown.budgetRows).to.equal(4);
    // meanClockRate(27 412 km) vs TT: (L_G − 3GM/(2ac²))·86 400 s·1e6 = 39.24649 µs/day with the IERS 2010
    // GM and L_G (IERS 2010 eq. 10.9; independent Python float computation [C]); shown to 4 decimals.
    expect(Number(shown.budgetTotal!.replace('−', '-'))).to.be.closeTo(39.24649, 6e-5);
    expect(shown.budgetCaution).to.contain('responsible engineering authority');
    expect(shown.scheduleRows).to.be.greaterThan(0);
    expect(shown.scheduleLabel).to.match(/\d+ commands? \(/);
    expect(shown.stabilityLabel).to.contain('Overlapping ADEV');
    expect(shown.reviewEntries).to.be.greaterThan(0);
    expect(shown.alerts).to.deep.equal([]);
  });

  it('examples/import-map.html loads the per-module build through the documented import map and shows the rate budget', async () => {
    const shown = await open('/packages/elements/examples/import-map.html');
    expect(shown.errors).to.deep.equal([]);
    expect(shown.importMap).to.equal(true);
    expect(shown.defined.length).to.equal(4);
    expect(shown.budgetRows).to.equal(4);
  });
});
