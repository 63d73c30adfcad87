// End-to-end: the built demo operations console (demo/index.html over the real packages' dist/)
// shows a steering schedule with commands; the run saves a screenshot to .ci-out/demo-console.png.
import { expect } from '@open-wc/testing';
import { executeServerCommand } from '@web/test-runner-commands';

async function loadDemo(search = ''): Promise<Document> {
  const frame = document.createElement('iframe');
  frame.style.cssText = 'width:1440px;height:1000px;border:0';
  frame.src = `/demo/index.html${search}`;
  document.body.append(frame);
  await new Promise((ok) => frame.addEventListener('load', ok, { once: true }));
  const doc = frame.contentDocument!;
  statusOf = () => doc.getElementById('status')?.textContent ?? '(no status)';
  return doc;
}

let statusOf: () => string = () => '';

async function until<T>(what: string, probe: () => T | null | undefined | false, timeoutMs = 15000): Promise<T> {
  const start = performance.now();
  for (;;) {
    const v = probe();
    if (v) return v;
    // The console's status line says why a recompute failed (e.g. an SDK error message).
    if (performance.now() - start > timeoutMs)
      throw new Error(`timed out waiting for ${what}; console status: ${statusOf()}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe('demo operations console (demo/index.html)', () => {
  after(() => document.querySelectorAll('iframe').forEach((f) => f.remove()));

  it('demo/index.html shows a steering schedule with commands, a rate budget, a stability plot and review findings', async () => {
    const doc = await loadDemo();
    const schedule = doc.querySelector('tauline-steering-schedule')!;
    const rows = await until('command rows', () => {
      const r = schedule.shadowRoot?.querySelectorAll('tbody tr[part~="row"]');
      return r && r.length > 0 ? r : null;
    });
    expect(rows.length).to.be.greaterThan(0);
    const label = schedule.shadowRoot!.querySelector('canvas.data')!.getAttribute('aria-label')!;
    expect(label).to.match(/\d+ commands? \(/);
    const budgetRows = doc.querySelector('tauline-rate-budget')!.shadowRoot!.querySelectorAll('tbody tr');
    expect(budgetRows.length).to.equal(4);
    const stabilityRows = await until(
      'stability rows',
      () => doc.querySelector('tauline-stability-plot')!.shadowRoot!.querySelectorAll('tbody tr').length,
    );
    expect(stabilityRows).to.be.greaterThan(3);
    expect(doc.querySelector('tauline-review-findings')!.shadowRoot!.querySelectorAll('details').length).to.equal(4);
    expect(doc.getElementById('status')!.textContent).to.contain('Recomputed in');
  });

  it('the what-if panel recomputes the budget and the schedule in the page when the semi-major axis changes', async () => {
    const doc = await loadDemo();
    const budget = doc.querySelector('tauline-rate-budget')!;
    const before = await until('budget', () => budget.shadowRoot?.querySelector('tr.total td')?.textContent);
    const sma = doc.getElementById('sma') as HTMLInputElement;
    sma.value = String(Number(sma.value) + 40);
    sma.dispatchEvent(new Event('input', { bubbles: true }));
    const after = await until('a new budget', () => {
      const text = budget.shadowRoot!.querySelector('tr.total td')!.textContent;
      return text !== before ? text : null;
    });
    expect(after).to.not.equal(before);
    expect(budget.label).to.contain(`${sma.value}`.slice(0, 5));
  });

  it('the what-if panel shows a metres-for-km semi-major axis, a tolerance below the minimum and an empty field as errors next to them, marks the results stale, and recomputes once valid', async () => {
    const doc = await loadDemo();
    const budget = doc.querySelector('tauline-rate-budget')!;
    const before = await until('budget', () => budget.shadowRoot?.querySelector('tr.total td')?.textContent);
    const type = (id: string, value: string): void => {
      const input = doc.getElementById(id) as HTMLInputElement;
      input.value = value;
      input.dispatchEvent(new Event('input', { bubbles: true }));
    };
    const errorOf = (id: string): string => {
      const input = doc.getElementById(id)!;
      expect(input.getAttribute('aria-invalid'), id).to.equal('true');
      const described = doc.getElementById(input.getAttribute('aria-describedby')!)!;
      expect(described.hidden, id).to.equal(false);
      return described.textContent!;
    };
    type('sma', '27870000');
    expect(errorOf('sma')).to.contain('looks like metres: this field takes kilometres (27\u202f870 km)');
    expect(doc.getElementById('schedule')!.hasAttribute('data-stale')).to.equal(true);
    expect(doc.getElementById('budget')!.hasAttribute('data-stale')).to.equal(true);
    expect(doc.getElementById('status')!.textContent).to.contain('stale');
    type('tol', '1');
    expect(errorOf('tol')).to.contain('1 ns is below the minimum');
    type('dA', '');
    expect(errorOf('dA')).to.contain('Empty');
    await new Promise((r) => setTimeout(r, 200));
    expect(budget.shadowRoot!.querySelector('tr.total td')!.textContent).to.equal(before); // nothing recomputed from bad input
    type('sma', '27910');
    type('tol', '25');
    type('dA', '12000');
    for (const id of ['sma', 'tol', 'dA']) {
      expect(doc.getElementById(id)!.hasAttribute('aria-invalid'), id).to.equal(false);
      expect(doc.getElementById(`${id}-error`)!.hidden, id).to.equal(true);
    }
    expect(doc.getElementById('schedule')!.hasAttribute('data-stale')).to.equal(false);
    const after = await until('a recomputed budget', () => {
      const text = budget.shadowRoot!.querySelector('tr.total td')!.textContent;
      return text !== before ? text : null;
    });
    expect(after).to.not.equal(before);
    expect(doc.getElementById('status')!.textContent).to.contain('Recomputed in');
  });

  it('every number shown in the elements and the status line uses one minus sign, U+2212 (no hyphen-minus before a digit)', async () => {
    const doc = await loadDemo();
    await until(
      'command rows',
      () =>
        doc.querySelector('tauline-steering-schedule')!.shadowRoot?.querySelectorAll('tbody tr[part~="row"]').length,
    );
    await until(
      'stability rows',
      () => doc.querySelector('tauline-stability-plot')!.shadowRoot?.querySelectorAll('tbody tr').length,
    );
    const texts: string[] = [doc.getElementById('status')!.textContent ?? ''];
    for (const el of doc.querySelectorAll(
      'tauline-steering-schedule, tauline-rate-budget, tauline-stability-plot, tauline-review-findings',
    )) {
      const root = el.shadowRoot!;
      // Open every review entry so its numbers are rendered text too.
      for (const d of root.querySelectorAll('details')) d.open = true;
      texts.push(root.textContent ?? '');
      for (const labelled of root.querySelectorAll('[aria-label]')) texts.push(labelled.getAttribute('aria-label')!);
    }
    // A hyphen-minus as a sign: at the start, or after a space, bracket, =, ±, Δ or an exponent's e.
    const offenders = texts.flatMap((t) => t.match(/(^|[\s(=±Δ:]|\de)-\d[^\s]*/g) ?? []);
    expect(offenders).to.deep.equal([]);
  });

  it('at 390×844 every view fits the width (scrollWidth ≤ innerWidth) and is saved to .ci-out/demo-390-<view>.png', async () => {
    const views = await executeServerCommand<
      Array<{ view: string; scrollWidth: number; innerWidth: number; wide: string[]; file: string }>,
      Record<string, unknown>
    >('tauline-demo-views', { path: '/demo/index.html', width: 390, height: 844 });
    expect(views.map((v) => v.view)).to.deep.equal(['top', 'schedule', 'budget', 'stability', 'review']);
    for (const v of views) {
      expect(v.scrollWidth, `${v.view}: ${v.wide.join('; ')}`).to.be.at.most(v.innerWidth);
      expect(v.file).to.contain(`demo-390-${v.view}.png`);
    }
  });

  it('at 360×740 (the narrowest supported width) the page still fits', async () => {
    const views = await executeServerCommand<
      Array<{ view: string; scrollWidth: number; innerWidth: number; wide: string[] }>,
      Record<string, unknown>
    >('tauline-demo-views', { path: '/demo/index.html', width: 360, height: 740, views: ['top', 'budget'] });
    for (const v of views) expect(v.scrollWidth, `${v.view}: ${v.wide.join('; ')}`).to.be.at.most(v.innerWidth);
  });

  it('the closed-loop what-if flies 30 days and shows time in tolerance for the planner beside no steering (steering keeps the clock in tolerance longer)', async function (this: Mocha.Context) {
    this.timeout(90000); // 2 strategies × 40 clocks × 30 days, synchronous in the page
    const doc = await loadDemo();
    await until(
      'command rows',
      () =>
        doc.querySelector('tauline-steering-schedule')!.shadowRoot?.querySelectorAll('tbody tr[part~="row"]').length,
    );
    (doc.getElementById('loop-run') as HTMLButtonElement).click();
    const rows = await until(
      'closed-loop rows',
      () => {
        const r = doc.querySelectorAll('#loop-table tbody tr');
        return r.length === 4 ? r : null;
      },
      60000,
    );
    const strategies = [...doc.querySelectorAll('#loop-table thead th')].map((th) => th.textContent);
    expect(strategies).to.deep.equal(['constrained LQ', 'no steering']);
    // First row: mean time in tolerance per strategy.
    expect(rows[0]!.querySelector('th')!.textContent).to.equal('In tolerance, mean');
    const share = (i: number) => Number(/([\d.]+) %/.exec(rows[0]!.querySelectorAll('td')[i]!.textContent ?? '')![1]);
    expect(share(0)).to.be.within(0, 100);
    expect(share(0)).to.be.greaterThan(share(1));
    expect(doc.getElementById('loop-table')!.hidden).to.equal(false);
    expect(doc.getElementById('loop-status')!.textContent).to.match(/flown in \d+ ms/);
  });

  it("the fleet view plans the four Corvane satellites with planFleet, says which one cannot be held and why, and shows the selected satellite's details", async () => {
    const doc = await loadDemo();
    const timeline = doc.querySelector('tauline-fleet-timeline')!;
    const rows = await until('fleet rows', () => {
      const r = timeline.shadowRoot?.querySelectorAll<HTMLTableRowElement>('tbody tr[part~="row"]');
      return r && r.length > 0 ? [...r] : null;
    });
    expect(rows.map((r) => r.dataset.id)).to.deep.equal(['CORVANE-A1', 'CORVANE-A2', 'CORVANE-B1', 'CORVANE-B2']);
    const summary = await until('fleet summary', () => doc.getElementById('fleet-summary')!.textContent);
    expect(summary).to.contain('Not feasible: 1 of 4 satellites cannot be held');
    expect(summary).to.contain('CORVANE-B2: too few passes');
    expect(rows[3]!.getAttribute('part')).to.contain('at-risk');
    expect(timeline.shadowRoot!.querySelectorAll('[part~="station-table"] tbody tr').length).to.equal(2);
    rows[0]!.querySelector<HTMLButtonElement>('button')!.click();
    const detail = await until('fleet details', () => doc.querySelector('#fleet-detail h3')?.textContent);
    expect(detail).to.match(/^CORVANE-A1 · \d+ uplinks?$/);
    expect(doc.querySelectorAll('#fleet-detail tbody tr').length).to.be.greaterThan(0);
    expect(doc.getElementById('events')!.textContent).to.contain('fleet: selected CORVANE-A1');
    const numbers = [
      doc.getElementById('fleet-summary')!.textContent!,
      doc.getElementById('fleet-detail')!.textContent!,
      timeline.shadowRoot!.textContent!,
    ];
    expect(numbers.flatMap((t) => t.match(/(^|[\s(=±Δ:]|\de)-\d[^\s]*/g) ?? [])).to.deep.equal([]);
  });

  it('at 360×740 the fleet view fits the width and is saved to .ci-out/demo-360-fleet.png', async () => {
    const views = await executeServerCommand<
      Array<{ view: string; scrollWidth: number; innerWidth: number; wide: string[] }>,
      Record<string, unknown>
    >('tauline-demo-views', { path: '/demo/index.html', width: 360, height: 740, views: ['fleet'] });
    for (const v of views) expect(v.scrollWidth, `${v.view}: ${v.wide.join('; ')}`).to.be.at.most(v.innerWidth);
  });

  it('saves a screenshot of the console to .ci-out/demo-console.png', async () => {
    const saved = await executeServerCommand<string, { path: string; out: string }>('tauline-demo-screenshot', {
      path: '/demo/index.html',
      out: '.ci-out/demo-console.png',
    });
    expect(saved).to.contain('demo-console.png');
  });
});
