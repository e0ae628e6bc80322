// The one-line view in the browser. Pan and zoom steps move the SVG's viewBox here, at once, with no
// round trip; once the view has settled the server is told, and it sends the drawing of what is then in
// view (symbols, labels legible at that zoom). The view's size on screen is reported the same way.
const views = new WeakMap();

/** Milliseconds without a further step before the server is asked for the new view's drawing. */
const settleMs = 150;

/** Screen pixels the pointer must move with the button down before a press becomes a drag. */
const dragPx = 3;

const round = v => Math.round(v * 100) / 100;

export function observe(svg, dotnet) {
  const root = svg.closest('.oneline');
  const state = { timer: 0, press: null, dragging: false };
  const box = () => svg.getBoundingClientRect();
  const report = () => {
    const r = box();
    dotnet.invokeMethodAsync('Resized', r.width, r.height);
  };

  // The view on screen now: the viewBox the server drew or the last step set.
  const current = () => {
    const [x, y, w, h] = (svg.getAttribute('viewBox') || '0 0 1 1').split(/[\s,]+/).map(Number);
    const r = box();
    return { cx: x + (w / 2), cy: y + (h / 2), scale: Math.min(r.width / w, r.height / h), width: r.width, height: r.height };
  };

  const show = v => {
    const was = current();
    if (Math.abs(v.scale - was.scale) < 1e-9 * was.scale && Math.abs(v.cx - was.cx) < 0.005 && Math.abs(v.cy - was.cy) < 0.005) {
      return; // at the zoom's limit: nothing moves, nothing to ask for
    }

    const w = v.width / v.scale;
    const h = v.height / v.scale;
    svg.setAttribute('viewBox', `${round(v.cx - (w / 2))} ${round(v.cy - (h / 2))} ${round(w)} ${round(h)}`);
    svg.style.setProperty('--s', String(v.scale));
    clearTimeout(state.timer);
    state.timer = setTimeout(() => {
      dotnet.invokeMethodAsync('ViewMoved', v.cx, v.cy, v.scale).catch(() => { /* the circuit is gone */ });
    }, settleMs);
  };

  // Zoom by a factor keeping the drawing point under the screen point (px, py) where it is.
  const zoomAt = (factor, px, py) => {
    const v = current();
    const least = Math.min(v.scale, parseFloat(root.dataset.minScale) || 0);
    const most = parseFloat(root.dataset.maxScale) || 4;
    const scale = Math.min(Math.max(v.scale * factor, least), most);
    const ux = v.cx + ((px - (v.width / 2)) / v.scale);
    const uy = v.cy + ((py - (v.height / 2)) / v.scale);
    show({ ...v, scale, cx: ux - ((px - (v.width / 2)) / scale), cy: uy - ((py - (v.height / 2)) / scale) });
  };

  const step = parseFloat(root.dataset.zoomStep) || Math.SQRT2;
  const onWheel = e => {
    e.preventDefault();
    const r = box();
    zoomAt(e.deltaY > 0 ? 1 / Math.sqrt(step) : Math.sqrt(step), e.clientX - r.left, e.clientY - r.top);
  };
  const onDown = e => {
    if (e.button === 0) {
      state.press = { x: e.clientX, y: e.clientY };
      state.dragging = false;
    }
  };
  const onMove = e => {
    if (!state.press || (e.buttons & 1) === 0) {
      state.press = null;
      return;
    }

    const dx = e.clientX - state.press.x;
    const dy = e.clientY - state.press.y;
    if (!state.dragging && Math.hypot(dx, dy) < dragPx) {
      return;
    }

    state.dragging = true;
    state.press = { x: e.clientX, y: e.clientY };
    const v = current();
    show({ ...v, cx: v.cx - (dx / v.scale), cy: v.cy - (dy / v.scale) });
  };
  const onUp = () => {
    state.press = null;
  };
  const buttons = [...root.querySelectorAll('[data-zoom]')].map(b => {
    const click = () => {
      const r = box();
      zoomAt(b.dataset.zoom === 'in' ? step : 1 / step, r.width / 2, r.height / 2);
    };
    b.addEventListener('click', click);
    return [b, click];
  });

  svg.addEventListener('wheel', onWheel, { passive: false });
  svg.addEventListener('pointerdown', onDown);
  svg.addEventListener('pointermove', onMove);
  svg.addEventListener('pointerup', onUp);
  svg.addEventListener('pointerleave', onUp);
  const observer = new ResizeObserver(report);
  observer.observe(svg);
  views.set(svg, () => {
    clearTimeout(state.timer);
    observer.disconnect();
    svg.removeEventListener('wheel', onWheel);
    svg.removeEventListener('pointerdown', onDown);
    svg.removeEventListener('pointermove', onMove);
    svg.removeEventListener('pointerup', onUp);
    svg.removeEventListener('pointerleave', onUp);
    buttons.forEach(([b, click]) => b.removeEventListener('click', click));
  });
  report();
}

export function forget(svg) {
  views.get(svg)?.();
  views.delete(svg);
}
