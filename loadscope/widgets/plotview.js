// loadscope PlotView: draws one plotly figure whose data lives in Python.
//
// initialize/render return at once (never wait for plotly.js here), so the
// widget is always set up inside anywidget's start-up window. plotly.js is
// loaded once per page and shared by every view (a promise on window):
// window.Plotly, else the `plotly_url` trait, else one {"kind": "need_plotly"}
// request answered with the bundle as a binary buffer.
// Messages from Python: {"kind": "figure", rev, figure} and
// {"kind": "delta", rev, base, data: [per-trace changes], layout: {changes}}.
// The element carries data-rev = the revision on screen (browser tests wait on it).
// A figure of 3D traces only is drawn by SceneView (scene3d.js, bundled in
// front of this file by plotview.py) on a canvas, without plotly.js.

const KEY = "__loadscopePlotly";
const PLOTLY_WAIT_MS = 15000; // how long one request for the bundle may take
const RETRY_MS = 3000; // pause before a view tries to draw again after a failure
const RETRIES = 5;

function injectScript(src, revoke) {
  return new Promise((resolve, reject) => {
    // A page with an AMD loader (classic notebook) would make plotly's UMD
    // wrapper register a module instead of setting window.Plotly.
    const savedDefine = window.define;
    window.define = undefined;
    const s = document.createElement("script");
    s.src = src;
    s.async = true;
    s.onload = () => {
      window.define = savedDefine;
      if (revoke) URL.revokeObjectURL(src);
      window.Plotly ? resolve(window.Plotly) : reject(new Error("plotly.js loaded but window.Plotly is missing"));
    };
    s.onerror = () => {
      window.define = savedDefine;
      reject(new Error("could not load plotly.js from " + src));
    };
    document.head.appendChild(s);
  });
}

function loadPlotly(model) {
  if (window.Plotly) return Promise.resolve(window.Plotly);
  if (window[KEY]) return window[KEY];
  const url = model.get("plotly_url");
  let promise;
  if (url) {
    promise = injectScript(new URL(url, document.baseURI).href, false);
  } else {
    promise = new Promise((resolve, reject) => {
      // The kernel answers one request per view every few seconds; a reply that does not come
      // (another tab asked just before) fails this attempt, and the view asks again later.
      const timer = setTimeout(() => {
        model.off("msg:custom", onMsg);
        reject(new Error("no plotly.js from the kernel yet"));
      }, PLOTLY_WAIT_MS);
      const onMsg = (msg, buffers) => {
        if (!msg || msg.kind !== "plotly") return;
        clearTimeout(timer);
        model.off("msg:custom", onMsg);
        if (!buffers || !buffers.length) {
          reject(new Error("plotly.js bundle missing from the reply"));
          return;
        }
        const blob = new Blob([buffers[0]], { type: "text/javascript" });
        injectScript(URL.createObjectURL(blob), true).then(resolve, reject);
      };
      model.on("msg:custom", onMsg);
      model.send({ kind: "need_plotly" });
    });
  }
  window[KEY] = promise.catch((err) => {
    delete window[KEY]; // a later view may try again
    throw err;
  });
  return window[KEY];
}

// Undo Python's encode(): {"$lsbuf": i, dtype} -> typed array over buffer i,
// {"$lsrun": [[item, count], ...]} -> the repeated list.
function decode(value, buffers) {
  if (Array.isArray(value)) return value.map((v) => decode(v, buffers));
  if (value === null || typeof value !== "object") return value;
  if ("$lsbuf" in value) {
    const dv = buffers[value.$lsbuf];
    const bytes = dv.buffer.slice(dv.byteOffset, dv.byteOffset + dv.byteLength);
    const arr = value.dtype === "i4" ? new Int32Array(bytes) : new Float32Array(bytes);
    // a polyline's gaps travel as NaN; plotly wants null there
    return value.gaps ? Array.from(arr, (v) => (Number.isNaN(v) ? null : v)) : arr;
  }
  if ("$lsrun" in value) {
    const out = [];
    for (const [item, count] of value.$lsrun) for (let i = 0; i < count; i++) out.push(item);
    return out;
  }
  const out = {};
  for (const [k, v] of Object.entries(value)) out[k] = decode(v, buffers);
  return out;
}

function applyChanges(target, changes) {
  for (const [k, v] of Object.entries(changes)) {
    if (v === null) delete target[k];
    else target[k] = v;
  }
}

function render({ model, el }) {
  const div = document.createElement("div");
  div.className = "loadscope-plot";
  el.appendChild(div);
  el.dataset.rev = "-1";
  let spec = null; // this view's copy of the figure
  let shown = -1; // revision of `spec`
  let asked = false; // a need_figure request is open
  let drawing = Promise.resolve();
  let alive = true;
  let failures = 0;
  let scene = null; // a SceneView (scene3d.js) while the figure is 3D

  const ask = () => {
    if (!asked) {
      asked = true;
      model.send({ kind: "need_figure" });
    }
  };

  const done = (rev, fig) => {
    failures = 0;
    delete el.dataset.error;
    el.dataset.rev = String(rev);
    el.dataset.figure = (fig.layout.meta && fig.layout.meta.figure) || "";
  };

  const draw = () => {
    const rev = shown;
    const fig = spec;
    if (isSceneFigure(fig)) {
      // our canvas renderer: no plotly.js, no WebGL; a delta is one repaint
      drawing = drawing.then(() => {
        if (!alive || fig !== spec || rev !== shown) return;
        if (!scene) {
          if (window.Plotly && div.isConnected) window.Plotly.purge(div);
          div.style.display = "none";
          scene = new SceneView(el);
        }
        scene.update(fig);
        done(rev, fig);
      }).catch((err) => {
        el.dataset.error = String(err && err.message ? err.message : err);
        console.error("loadscope PlotView:", err);
      });
      return;
    }
    if (scene) {
      scene.destroy();
      scene = null;
      div.style.display = "";
    }
    drawing = drawing
      .then(() => loadPlotly(model))
      .then((Plotly) => {
        if (!alive || fig !== spec || rev !== shown) return; // a newer state follows
        return Plotly.react(div, fig.data, fig.layout, { responsive: true, displaylogo: false }).then(() => done(rev, fig));
      })
      .catch((err) => {
        el.dataset.error = String(err && err.message ? err.message : err);
        console.error("loadscope PlotView:", err);
        if (alive && ++failures <= RETRIES) setTimeout(() => alive && rev === shown && draw(), RETRY_MS);
      });
  };

  const onMsg = (msg, buffers) => {
    if (!msg || typeof msg !== "object") return;
    buffers = buffers || [];
    if (msg.kind === "figure") {
      asked = false;
      if (msg.rev < shown) return;
      spec = decode(msg.figure, buffers);
      shown = msg.rev;
      draw();
    } else if (msg.kind === "delta") {
      if (msg.rev <= shown) return;
      if (spec === null || msg.base !== shown) {
        ask(); // we missed a revision: fetch the whole figure
        return;
      }
      const data = spec.data.map((t) => Object.assign({}, t));
      decode(msg.data || [], buffers).forEach((changes, i) => {
        if (changes && data[i]) applyChanges(data[i], changes);
      });
      const layout = Object.assign({}, spec.layout);
      applyChanges(layout, decode(msg.layout || {}, buffers));
      spec = { data, layout };
      shown = msg.rev;
      draw();
    }
  };

  model.on("msg:custom", onMsg);
  ask();
  return () => {
    alive = false;
    model.off("msg:custom", onMsg);
    if (scene) scene.destroy();
    if (window.Plotly && div.isConnected) window.Plotly.purge(div);
  };
}

export default { render };
