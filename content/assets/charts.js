// Draws the scenario charts from the inline JSON data block with Chart.js (bundled with the site).
// Display only: it plots the engine's numbers; "ratio to baseline" divides two plotted series.
(() => {
  var dataElement = document.getElementById("chart-data");
  var diffToggle = document.getElementById("show-diffs");
  if (diffToggle) {
    diffToggle.addEventListener("change", () => {
      document.body.classList.toggle("hide-diffs", !diffToggle.checked);
    });
  }
  if (typeof Chart === "undefined") return;
  // Our palette, with a line pattern per model so that greyscale prints still tell models apart. One source for the
  // pages and the exported images: src/presentation/chartStyle.ts, placed in the page as inline data.
  var style = JSON.parse(document.getElementById("chart-style").textContent);
  var COLOURS = style.colours;
  var DASHES = style.dashes;
  var MARKERS = style.markers;
  Chart.defaults.animation = false;
  Chart.defaults.font.family = "system-ui, 'DejaVu Sans', sans-serif";
  Chart.defaults.color = style.ink;
  window.cosmoledgerCharts = {};

  // Index: one small D_L(z) chart per scenario card.
  var indexElement = document.getElementById("index-chart-data");
  if (indexElement) {
    JSON.parse(indexElement.textContent).forEach((scenario) => {
      var canvas = document.querySelector(`canvas[data-mini="${scenario.id}"]`);
      if (!canvas) return;
      window.cosmoledgerCharts[scenario.id] = new Chart(canvas, {
        type: "line",
        data: {
          datasets: scenario.models.map((m, i) => ({
            label: m.label,
            data: scenario.z.map((z, j) => ({ x: z, y: m.values[j] })),
            borderColor: COLOURS[i % COLOURS.length],
            borderDash: DASHES[i % DASHES.length],
            borderWidth: 1.5,
            pointRadius: 0,
          })),
        },
        options: {
          parsing: false,
          responsive: true,
          maintainAspectRatio: false,
          scales: {
            x: { type: "linear", title: { display: true, text: "z" } },
            y: { title: { display: true, text: scenario.yTitle } },
          },
          plugins: { legend: { display: false } },
        },
      });
    });
  }
  if (!dataElement) return;
  var data = JSON.parse(dataElement.textContent);
  var baseline = data.models.filter((m) => m.id === data.baseline)[0];
  var byKey = {};
  data.series.forEach((s) => {
    byKey[s.key] = s;
  });
  window.cosmoledgerCharts = {};

  document.querySelectorAll("figure.chart").forEach((figure) => {
    var canvas = figure.querySelector("canvas");
    var seriesInput = figure.querySelector("[data-series]");
    var logInput = figure.querySelector("[data-log]");
    var ratioInput = figure.querySelector("[data-ratio]");
    var logYInput = figure.querySelector("[data-logy]");
    // The y axis starts logarithmic where the quantity spans more than a decade over the plotted range (decided at
    // build time, as for the exported images); the switch overrides it. A ratio is always drawn linear.
    function defaultLogY() {
      logYInput.checked = !!byKey[seriesInput.value].logY;
    }
    defaultLogY();
    function logY() {
      return logYInput.checked && !ratioInput.checked;
    }
    function build() {
      var key = seriesInput.value;
      var ratio = ratioInput.checked;
      var log = logInput.checked;
      var base = baseline.values[key];
      // A model with a spread gets a shaded 68 % band: its 16th-percentile curve (no line), then its 84th-percentile
      // curve filled down to it. Bands come after the model curves, so dataset i is still model i (legend, markers).
      var bands = [];
      data.models.forEach((m, i) => {
        var band = m.bands?.[key];
        if (!band) return;
        var lo = [];
        var hi = [];
        for (let j = 0; j < data.z.length; j++) {
          const x = data.z[j];
          if (log && !(x > 0)) continue;
          if (data.xRange && (x < data.xRange[0] || x > data.xRange[1])) continue;
          let a = band.lo[j];
          let b = band.hi[j];
          if (ratio) {
            a = a === null || !base[j] ? null : a / base[j];
            b = b === null || !base[j] ? null : b / base[j];
          }
          if (logY() && !(a > 0 && b > 0)) a = b = null;
          lo.push({ x: x, y: a });
          hi.push({ x: x, y: b });
        }
        var colour = COLOURS[i % COLOURS.length];
        var common = { isBand: true, borderWidth: 0, pointRadius: 0, spanGaps: false, borderColor: "transparent" };
        bands.push(Object.assign({ label: `${m.label}: 16th percentile`, data: lo, fill: false }, common));
        bands.push(
          Object.assign(
            { label: `${m.label}: 84th percentile`, data: hi, backgroundColor: `${colour}33`, fill: "-1" },
            common,
          ),
        );
      });
      var curves = data.models.map((m, i) => {
        var ys = m.values[key];
        var points = [];
        for (let j = 0; j < data.z.length; j++) {
          const x = data.z[j];
          if (log && !(x > 0)) continue;
          if (data.xRange && (x < data.xRange[0] || x > data.xRange[1])) continue;
          let y = ys[j];
          if (ratio) y = y === null || !base[j] ? null : y / base[j];
          if (logY() && !(y > 0)) y = null;
          points.push({ x: x, y: y });
        }
        var every = Math.max(1, Math.round(points.length / 9));
        return {
          label: m.label,
          data: points,
          borderColor: COLOURS[i % COLOURS.length],
          backgroundColor: COLOURS[i % COLOURS.length],
          borderDash: DASHES[i % DASHES.length],
          borderWidth: 2,
          // Each model's own marker every few points (offset per model so that markers do not sit on each other).
          pointStyle: MARKERS[i % MARKERS.length],
          pointRadius: (c) => ((c.dataIndex + i) % every === 0 ? 3.5 : 0),
          pointBorderWidth: 1.2,
          spanGaps: false,
          fill: false,
        };
      });
      return curves.concat(bands);
    }
    function yTitle() {
      var s = byKey[seriesInput.value];
      return ratioInput.checked
        ? `${s.label} / baseline (${data.baseline})`
        : s.label + (s.unitText ? ` [${s.unitText}]` : "");
    }
    // The model's marker drawn on the middle of its legend line, so that the legend shows both (as the curves do).
    var legendMarkers = {
      id: "legend-markers",
      afterDraw: (c) => {
        var boxes = c.legend?.legendHitBoxes || [];
        boxes.forEach((box, i) => {
          var ctx = c.ctx;
          ctx.save();
          ctx.setLineDash([]);
          ctx.strokeStyle = COLOURS[i % COLOURS.length];
          ctx.fillStyle = COLOURS[i % COLOURS.length];
          ctx.lineWidth = 1;
          Chart.helpers.drawPoint(
            ctx,
            { pointStyle: MARKERS[i % MARKERS.length], radius: 3.5, borderWidth: 1.2, rotation: 0 },
            box.left + 18,
            box.top + box.height / 2,
          );
          ctx.restore();
        });
      },
    };
    var chart = new Chart(canvas, {
      type: "line",
      plugins: [legendMarkers],
      data: { datasets: build() },
      options: {
        parsing: false,
        normalized: true,
        responsive: true,
        maintainAspectRatio: false,
        interaction: { mode: "nearest", axis: "x", intersect: false },
        scales: {
          x: {
            type: logInput.checked ? "logarithmic" : "linear",
            // The scenario's own redshift range when it left the grid to its default (chartStyle.ts decides).
            min: data.xRange ? data.xRange[0] : undefined,
            max: data.xRange ? data.xRange[1] : undefined,
            title: { display: true, text: "redshift z" },
            ticks: {
              maxRotation: 0,
              callback: function (value, index, ticks) {
                // On the log axis only 1, 2 and 5 times a power of ten are labelled, so that labels do not crowd.
                if (this.type !== "logarithmic") return Chart.Ticks.formatters.numeric.call(this, value, index, ticks);
                var v = Number(value);
                var m = v / 10 ** Math.floor(Math.log10(v) + 1e-9);
                return [1, 2, 5].some((k) => Math.abs(m - k) < 1e-6) ? String(Number(v.toPrecision(3))) : "";
              },
            },
          },
          y: { type: logY() ? "logarithmic" : "linear", title: { display: true, text: yTitle() } },
        },
        // Swatches are short lines with each model's dash pattern (as in the exported images), readable in greyscale.
        plugins: {
          tooltip: { filter: (item) => !item.dataset.isBand },
          legend: {
            position: "bottom",
            labels: {
              usePointStyle: true,
              pointStyleWidth: 36,
              generateLabels: (c) =>
                c.data.datasets
                  .filter((d) => !d.isBand)
                  .map((d, i) => ({
                    text: d.label,
                    datasetIndex: i,
                    pointStyle: "line",
                    fillStyle: COLOURS[i % COLOURS.length],
                    strokeStyle: COLOURS[i % COLOURS.length],
                    lineWidth: 2,
                    lineDash: DASHES[i % DASHES.length],
                    hidden: !c.isDatasetVisible(i),
                  })),
            },
          },
        },
      },
    });
    function update() {
      chart.data.datasets = build();
      chart.options.scales.x.type = logInput.checked ? "logarithmic" : "linear";
      chart.options.scales.y.type = logY() ? "logarithmic" : "linear";
      chart.options.scales.y.title.text = yTitle();
      chart.update();
    }
    [logInput, ratioInput, logYInput].forEach((input) => {
      if (input) input.addEventListener("change", update);
    });
    seriesInput.addEventListener("change", () => {
      defaultLogY();
      update();
    });
    window.cosmoledgerCharts[figure.getAttribute("data-chart")] = chart;
  });
})();
