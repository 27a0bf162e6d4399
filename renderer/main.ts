// The window's entry point: builds the panels, connects the bridge and the fit worker, opens the first capture.

import { h } from './dom';
import { createBridge } from './bridge';
import { FitClient } from './fitClient';
import { FitPlot } from './plot/fitPlot';
import { BenchController } from './benchController';
import { initialState } from './benchState';
import { applyTheme, currentTheme, initialTheme } from './theme';
import { plainMessage } from './plainMessage';
import { createTopBar } from './panels/topBar';
import { createCapturePanel } from './panels/capturePanel';
import { createFitPanel } from './panels/fitPanel';
import { createComponentsPanel } from './panels/componentsPanel';
import { createDesignPanel } from './panels/designPanel';
import { createParasiticPanel } from './panels/parasiticPanel';
import { createCautionsPanel } from './panels/cautionsPanel';
import { createBenchLogPanel } from './panels/benchLogPanel';
import { installFileDrop } from './fileDrop';
import { installShortcuts } from './shortcuts';
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
  const state = initialState(bridge.face);
  let renderQueued = false;
  const render = () => {
    if (renderQueued) return;
    renderQueued = true;
    requestAnimationFrame(() => {
      renderQueued = false;
      for (const panel of panels) panel.render(state);
    });
  };
  const plot = new FitPlot(plotRoot, (window) => void controller.setWindow(window));
  const controller = new BenchController(state, bridge, new FitClient('worker.js'), plot, render);
  const toggleTheme = () => {
    applyTheme(currentTheme() === 'dark' ? 'light' : 'dark');
    void plot.redraw();
    render();
  };
  const top = createTopBar(controller, toggleTheme);
  const capture = createCapturePanel(controller);
  const fit = createFitPanel(controller);
  const components = createComponentsPanel(controller);
  const design = createDesignPanel(controller);
  const parasitic = createParasiticPanel(controller);
  const cautions = createCautionsPanel();
  const log = createBenchLogPanel(controller);
  const panels = [top, capture, fit, components, design, parasitic, cautions, log];

  const legend = h(
    'p',
    { class: 'plot-key' },
    h('span', { class: 'key window' }, 'fit window: drag its edges to refit'),
    h('span', {}, 'drag on the plot to zoom, double-click to see the whole capture'),
  );
  app.replaceChildren(
    top.root,
    top.banner,
    h(
      'main',
      { class: 'bench' },
      h(
        'div',
        { class: 'primary-column' },
        h('section', { class: 'card plot-card', attrs: { 'aria-label': 'Plot' } }, plotRoot, legend),
        h('div', { class: 'pair' }, h('div', { class: 'stack' }, capture.root, components.root), fit.root),
        design.root,
      ),
      h('div', { class: 'side-column' }, cautions.root, log.root, parasitic.root),
    ),
  );
  render();

  const commands: Record<MenuCommand, () => void> = {
    'open-capture': () => void controller.pickCapture(),
    'open-design': () => void controller.pickDesign(),
    'save-report': () => void controller.exportReport('html'),
    'export-png': () => void controller.exportPlot('png'),
    'export-svg': () => void controller.exportPlot('svg'),
    'toggle-theme': toggleTheme,
  };
  bridge.onMenuCommand((command) => commands[command]());
  bridge.onCaptureOpened((opened) => void controller.openCapture(opened, {}));
  if (bridge.face === 'browser') installShortcuts(commands);
  installFileDrop(document.body, (file) => void controller.openDropped(file));
  // A last net: whatever slips through is shown in words, never left as a blank or a stack.
  window.addEventListener('unhandledrejection', (event) => {
    event.preventDefault();
    state.error = plainMessage(event.reason);
    render();
  });
  new ResizeObserver(() => void plot.redraw()).observe(plotRoot);
  void controller.start();
}

boot();
