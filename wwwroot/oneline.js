// The one-line view's size on screen, reported to the server so it draws only what is in view.
const observers = new WeakMap();

export function observe(element, dotnet) {
  const report = () => {
    const r = element.getBoundingClientRect();
    dotnet.invokeMethodAsync('Resized', r.width, r.height);
  };
  const observer = new ResizeObserver(report);
  observer.observe(element);
  observers.set(element, observer);
  report();
}

export function forget(element) {
  observers.get(element)?.disconnect();
  observers.delete(element);
}
