/**
 * The text parts of the page: the block's id and status, the facts, the
 * notes, the first error of an invalid block, and the list of pinned runs.
 * Every string from a note is set with `textContent`, never parsed as HTML.
 */
import type { CurvePayload, PinnedPlot, PinnedRun, ProblemPayload } from '../../src/core/packageFree';

function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  text?: string,
  className?: string,
): HTMLElementTagNameMap[K] {
  const e = document.createElement(tag);
  if (text !== undefined) e.textContent = text;
  if (className) e.className = className;
  return e;
}

function byId<T extends HTMLElement>(id: string): T {
  const e = document.getElementById(id);
  if (!e) throw new Error(`the page lacks #${id}`);
  return e as T;
}

/** What the page shows: a chart, a problem, or nothing yet. */
export type PanelState = 'chart' | 'problem' | 'empty';

/** The page's text regions, found once by id. */
export class Panel {
  private readonly title = byId('block-title');
  private readonly status = byId('block-status');
  private readonly charts = byId('charts');
  private readonly problem = byId('problem');
  private readonly facts = byId('facts');
  private readonly notes = byId('notes');
  private readonly pins = byId('pin-list');
  private readonly pinsSection = byId('pins');

  private show(state: PanelState): void {
    document.body.dataset.state = state;
    this.charts.hidden = state !== 'chart';
    this.problem.hidden = state === 'chart';
  }

  /** A drawable block: its id, status, facts and notes (the charts are drawn by the caller). */
  showCurve(p: CurvePayload): void {
    this.show('chart');
    this.title.textContent = p.id;
    this.status.textContent = p.status;
    this.status.dataset.status = p.status;
    this.facts.replaceChildren(...p.facts.flatMap((f) => [el('dt', f.label), el('dd', f.text)]));
    this.notes.replaceChildren(...p.notes.map((n) => el('li', n)));
  }

  /** A block with an error: its first diagnostic instead of a stale chart. */
  showProblem(p: ProblemPayload): void {
    this.show('problem');
    this.title.textContent = p.id ?? 'block without id';
    // The chip says what is drawn: a plot below when the block has one, nothing only when it has none.
    const drawn = p.plot ? (p.plot.kind === 'series' ? 'series fit' : 'Boltzmann plot') : 'nothing to draw';
    this.status.textContent = p.code === null ? drawn : 'invalid';
    this.status.dataset.status = p.code === null ? (p.plot ? 'plot' : 'empty') : 'invalid';
    const code = p.code === null ? [] : [el('code', p.code, 'code')];
    // An explanation is a note, not an error: styled and announced as one.
    this.problem.dataset.kind = p.code === null ? 'note' : 'error';
    this.problem.setAttribute('role', p.code === null ? 'status' : 'alert');
    this.problem.replaceChildren(el('span', p.message, 'message'), ...code);
    this.facts.replaceChildren();
    this.notes.replaceChildren();
  }

  /** No block yet. */
  showEmpty(): void {
    this.show('empty');
    this.title.textContent = 'Curve view';
    this.status.textContent = '';
    delete this.status.dataset.status;
    this.problem.replaceChildren(
      el('span', 'Place the cursor in a `levels` block of a note to draw its curve.', 'message'),
    );
    this.facts.replaceChildren();
    this.notes.replaceChildren();
  }

  /** The pinned runs, each with an unpin button; `unpin` receives the run's key. */
  showPins(pins: readonly PinnedRun[], plots: readonly PinnedPlot[], unpin: (key: string) => void): void {
    this.pinsSection.hidden = pins.length === 0 && plots.length === 0;
    const item = (key: string, id: string, detail: string): HTMLElement => {
      const li = el('li');
      li.dataset.key = key;
      const button = el('vscode-button', 'Unpin') as HTMLElement;
      button.setAttribute('secondary', '');
      button.addEventListener('click', () => unpin(key));
      li.append(el('span', id, 'pin-id'), el('span', ` — ${detail}`, 'pin-status'), button);
      return li;
    };
    this.pins.replaceChildren(
      ...pins.map((r) => item(r.key, r.payload.id, r.payload.status)),
      ...plots.map((r) => item(r.key, r.id, r.plot.kind === 'series' ? 'series fit' : 'Boltzmann plot')),
    );
  }
}
