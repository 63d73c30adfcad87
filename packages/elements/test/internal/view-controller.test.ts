import { expect } from '@open-wc/testing';
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { type Span, ViewController } from '../../src/internal/view-controller.js';

/** A host that counts update requests; the controller needs nothing else. */
function host(): ReactiveControllerHost & { updates: number } {
  const h = {
    updates: 0,
    addController(_c: ReactiveController): void {},
    removeController(_c: ReactiveController): void {},
    requestUpdate(): void {
      h.updates += 1;
    },
    updateComplete: Promise.resolve(true),
  };
  return h;
}

const FRAME = { left: 50, top: 10, width: 500, height: 200 };

function make(): { vc: ViewController; changes: Array<{ span: Span; byUser: boolean }> } {
  const changes: Array<{ span: Span; byUser: boolean }> = [];
  const vc = new ViewController(host(), (span, byUser) => changes.push({ span, byUser }));
  vc.setDomain([0, 1000]);
  return { vc, changes };
}

/** Geometry of a view [a, b] on FRAME: pixel → x. */
const geometry = (vc: ViewController) => ({
  frame: FRAME,
  invert: (px: number) => vc.view![0] + ((px - FRAME.left) * (vc.view![1] - vc.view![0])) / FRAME.width,
});

describe('ViewController (time-axis view of the plots)', () => {
  it('new ViewController(host, onChange).setDomain(full) shows the full span and keeps a zoom that still fits new data', () => {
    const { vc, changes } = make();
    expect(vc.view).to.deep.equal([0, 1000]);
    vc.set(100, 300, false);
    vc.setDomain([0, 2000]);
    expect(vc.view).to.deep.equal([100, 300]);
    vc.setDomain([200, 2000]);
    expect(vc.view).to.deep.equal([200, 2000]);
    vc.setDomain(null);
    expect(vc.view).to.equal(null);
    expect(changes).to.deep.equal([{ span: [100, 300], byUser: false }]);
  });

  it('ViewController.set(a, b) clamps to the data and to the smallest span (1e-5 of it, at least 1 unit), reporting only changes', () => {
    const { vc, changes } = make();
    vc.set(-100, 100, true);
    expect(vc.view).to.deep.equal([0, 200]);
    vc.set(500, 500.1, true);
    expect(vc.view![1] - vc.view![0]).to.be.closeTo(1, 1e-9);
    vc.set(500, 500.1, true);
    expect(changes.length).to.equal(2);
    vc.set(-5e3, 5e3, false);
    expect(vc.view).to.deep.equal([0, 1000]);
  });

  it('ViewController.zoom(factor, anchor) keeps the anchor in place and pan(fraction) shifts by a fraction of the span', () => {
    const { vc } = make();
    vc.zoom(0.5, 400, true);
    expect(vc.view).to.deep.equal([200, 700]);
    vc.pan(0.1);
    expect(vc.view).to.deep.equal([250, 750]);
    vc.zoomAtCenter(0.8);
    expect(vc.view![1] - vc.view![0]).to.be.closeTo(400, 1e-9);
    vc.reset(true);
    expect(vc.view).to.deep.equal([0, 1000]);
  });

  it('ViewController pointer gestures: a press without movement is a click, a drag pans against the pointer, a pinch zooms', () => {
    const { vc, changes } = make();
    vc.pointerDown(1, { x: 300, y: 50 });
    expect(vc.pointerMove(1, { x: 302, y: 50 }, geometry(vc))).to.equal(true);
    expect(vc.pointerUp(1)).to.equal('click');
    expect(vc.pointerMove(9, { x: 100, y: 50 }, geometry(vc)), 'a free hover').to.equal(false);
    vc.set(200, 700, false);
    vc.pointerDown(1, { x: 300, y: 50 });
    vc.pointerMove(1, { x: 200, y: 50 }, geometry(vc)); // 100 px of a 500 px frame showing 500 units: +100 units
    expect(vc.pointerUp(1)).to.equal('drag');
    expect(vc.view).to.deep.equal([300, 800]);
    vc.reset(false);
    vc.pointerDown(1, { x: 250, y: 50 });
    vc.pointerDown(2, { x: 350, y: 50 });
    vc.pointerMove(1, { x: 150, y: 50 }, geometry(vc));
    vc.pointerMove(2, { x: 450, y: 50 }, geometry(vc)); // fingers 3 × farther apart: a third of the span
    expect(vc.pointerUp(1)).to.equal('none');
    expect(vc.pointerUp(2)).to.equal('drag');
    expect(vc.view![1] - vc.view![0]).to.be.closeTo(1000 / 3, 1e-9);
    expect(
      changes.every((c) => !c.byUser),
      'gestures report on release only',
    ).to.equal(true);
  });

  it('ViewController.wheel(dx, dy, px, geometry) zooms around the x under the pointer and pans on a horizontal delta', () => {
    const { vc, changes } = make();
    vc.wheel(0, -200, 300, geometry(vc)); // x under the pointer: 500
    const [a, b] = vc.view!;
    expect(b - a).to.be.closeTo(1000 * Math.exp(-0.3), 1e-9);
    expect((500 - a) / (b - a)).to.be.closeTo(0.5, 1e-12);
    vc.wheel(50, 0, 300, geometry(vc));
    expect(vc.view![0]).to.be.closeTo(a + (b - a) * 0.1, 1e-9);
    expect(changes.map((c) => c.byUser)).to.deep.equal([true, true]);
  });
});
