// The window's entry point: builds the panels over one store, connects the bridge and the fit worker, owns the
// page (its address and title), and opens the first capture.

import { h } from './dom';
import { createBridge } from './bridge';
import { FitClient } from './fitClient';
import { FitPlot } from './plot/fitPlot';
import { bindActions } from './actions';
import { initialState } from './benchState';
import { createStore } from './store';
import { applyTheme, currentTheme, initialTheme } from './theme';
import { plainMessage } from './plainMessage';
import { createTopBar } from './panels/topBar';
import { createCapturePanel } from './panels/capturePanel';
import { createFitPanel } from './panels/fitPanel';
import { createComponentsPanel } from './panels/componentsPanel';
import { createDesignPanel } from './panels/designPanel';
import { createParasiticPanel } from './panels/parasiticPanel';
import { createBeforeAfterPanel } from './panels/beforeAfterPanel';
import { createCautionsPanel } from './panels/cautionsPanel';
import { createBenchLogPanel } from './panels/benchLogPanel';
import { installFileDrop } from './fileDrop';
import { installShortcuts, type ShortcutCommand } from './shortcuts';
import { createShortcutList } from './shortcutList';
import { arrangeBench } from './benchLayout';
import { drawCapacitanceLine, drawOverlay } from './plot/comparePlots';
import { readSession } from './benchMemory';
import { sessionKeeper } from './actions/session';
import type { MenuCommand } from './bridgeTypes';

function boot(): void {
  applyTheme(initialTheme());
  const app = document.getElementById('app') as HTMLElement;
  const captureInput = document.getElementById('capture-input') as HTMLInputElement;
  const designInput = document.getElementById('design-input') as HTMLInputElement;
  let bridge;
  try {
    bridge = createBridge(captureInput, designInput);
  } catch (error) {
    app.replaceChildren(h('div', { class: 'fatal', attrs: { role: 'alert' } }, h('h1', {}, 'Ringbench'), h('p', {}, plainMessage(error))));
    return;
  }
  const plotRoot = h('div', { class: 'plot', id: 'fit-plot', attrs: { 'aria-label': 'Measured samples, fit, design prediction and residuals' } });
  const store = createStore(initialState(bridge.face), (run) => requestAnimationFrame(run));
  const shortcutList = createShortcutList();
  const plot = new FitPlot(plotRoot, {
    onWindowChange: (window) => void actions.setWindow(window),
    onEventChoice: (event) => void actions.chooseEvent(event),
    onShowShortcuts: () => shortcutList.toggle(),
  });
  const page = { showCaptureName: (name: string) => (document.title = `${name} — Ringbench`) };
  const opens = { started: 0, shown: 0, running: new Set<number>() };
  const actions = bindActions({ store, bridge, client: new FitClient('worker.js'), plot, page, counters: { running: 0, fitGeneration: 0, captures: 0 }, opens });
  const toggleTheme = () => {
    applyTheme(currentTheme() === 'dark' ? 'light' : 'dark');
    void plot.redraw();
    store.update();
  };
  const top = createTopBar(actions, toggleTheme);
  const capture = createCapturePanel(actions);
  const fit = createFitPanel(actions);
  const components = createComponentsPanel(actions);
  const design = createDesignPanel(actions);
  const parasitic = createParasiticPanel(actions, drawCapacitanceLine);
  const beforeAfter = createBeforeAfterPanel(actions, drawOverlay);
  const cautions = createCautionsPanel();
  const log = createBenchLogPanel(actions);
  for (const panel of [top, capture, fit, components, design, parasitic, beforeAfter, cautions, log]) store.subscribe(panel.render);

  arrangeBench(app, {
    topBar: top.root,
    banner: top.banner,
    plot: h('section', { class: 'card plot-card', attrs: { 'aria-label': 'Plot' } }, plot.view),
    design: design.root,
    capture: capture.root,
    components: components.root,
    fit: fit.root,
    cautions: cautions.root,
    extraction: parasitic.root,
    beforeAfter: beforeAfter.root,
    log: log.root,
  });
  store.update();

  document.body.append(shortcutList.root);
  const commands: Record<MenuCommand, () => void> = {
    'open-capture': () => void actions.pickCapture(),
    'open-design': () => void actions.pickDesign(),
    'save-report': () => void actions.exportReport('html'),
    'export-png': () => void actions.exportPlot('png'),
    'export-svg': () => void actions.exportPlot('svg'),
    'toggle-theme': toggleTheme,
  };
  bridge.onMenuCommand((command) => commands[command]());
  bridge.onCaptureOpened((opened) => void actions.openCapture(opened));
  const keys: Record<ShortcutCommand, () => void> = {
    ...commands,
    'pan-earlier': () => plot.panTime(-1),
    'pan-later': () => plot.panTime(1),
    'zoom-in-time': () => plot.zoomTime('in'),
    'zoom-out-time': () => plot.zoomTime('out'),
    'zoom-in-level': () => plot.zoomLevel('in'),
    'zoom-out-level': () => plot.zoomLevel('out'),
    'whole-capture': () => plot.showWhole(),
    'toggle-cursors': () => plot.toggleCursors(),
    'toggle-markers': () => plot.toggleMarkers(),
    'show-shortcuts': () => shortcutList.toggle(),
  };
  installShortcuts(keys, bridge.face === 'browser');
  installFileDrop(document.body, (file) => void actions.openDropped(file));
  // A last net: whatever slips through is shown in words, never left as a blank or a stack.
  window.addEventListener('unhandledrejection', (event) => {
    event.preventDefault();
    store.update((state) => (state.error = plainMessage(event.reason)));
  });
  new ResizeObserver(() => void plot.redraw()).observe(plotRoot);
  // The session left last time is read before anything opens, put back on the first capture if it is the same one, and
  // only then kept again (so the first start's defaults never overwrite it).
  const savedSession = readSession();
  void actions
    .start(new URLSearchParams(location.search).get('sample'))
    .then(() => actions.restoreSession(savedSession))
    .finally(() => store.subscribe(sessionKeeper()));
}

boot();
