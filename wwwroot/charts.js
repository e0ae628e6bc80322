// Draws the history page's bar charts with Chart.js (vendored in lib/chartjs, MIT licence).
const charts = new Map();

export function bar(canvasId, labels, series, title) {
  const canvas = document.getElementById(canvasId);
  if (!canvas || !window.Chart) {
    return false;
  }
  charts.get(canvasId)?.destroy();
  const patterns = ['#1f3d7a', '#d9480f', '#2b8a3e', '#868e96'];
  const chart = new window.Chart(canvas, {
    type: 'bar',
    data: {
      labels,
      datasets: series.map((s, k) => ({ label: s.label, data: s.values, backgroundColor: patterns[k % patterns.length] })),
    },
    options: {
      animation: false,
      responsive: true,
      plugins: { title: { display: true, text: title }, legend: { display: series.length > 1 } },
      scales: { y: { beginAtZero: true, ticks: { precision: 0 } } },
    },
  });
  charts.set(canvasId, chart);
  // Tells the browser tests (and anyone looking) that the chart has drawn.
  canvas.dataset.drawn = 'true';
  return true;
}
