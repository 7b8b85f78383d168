// loadscope scene renderer: draws a figure made only of mesh3d and scatter3d
// traces (what loadscope.viz.force_scene emits) on a 2D <canvas>, no WebGL.
//
// Why: plotly's 3D costs ~1 s of WebGL set-up and shader compiling per scene
// in a software-rendering browser, needs the 4.8 MB bundle, and a page of
// several WebGL contexts can hit the browser's cap on live contexts.
//
// This file is not a module of its own: plotview.py puts it in front of
// plotview.js, which calls isSceneFigure() and new SceneView(...).
//
// What it reads from the spec: mesh3d x/y/z/i/j/k, color, opacity, lighting
// (ambient, diffuse); scatter3d x/y/z (null/NaN break a polyline), mode
// (lines, markers, text), line color/width/dash, marker color/size/symbol,
// text/textfont; visible (true / "legendonly" / false), name, legendgroup,
// showlegend, hovertext/text, hoverinfo ("skip"/"none": no hover);
// layout height, title, font, paper_bgcolor, annotations (as notes below the
// scene), uirevision, scene.camera (eye/up/center), scene.aspectmode
// (data/cube/manual/auto) and aspectratio, scene.{x,y,z}axis.title and
// backgroundcolor. Projection is orthographic; triangles are flat-shaded
// from a light fixed to the viewer and painted far to near with the lines
// and markers.

const SCENE_TYPES = new Set(["mesh3d", "scatter3d"]);
const HOVER_PX = 6; // how close [px] the pointer must come to a line or point
const DRAG_RAD_PER_PX = 0.008;
const MAX_ELEVATION = 1.5; // [rad], just short of looking straight down the up axis
const ZOOM_LIMITS = [0.25, 25];
const DASHES = { dash: [8, 6], dot: [2, 4], dashdot: [8, 4, 2, 4], longdash: [14, 6], longdashdot: [14, 4, 2, 4] };

function isSceneFigure(fig) {
  return !!fig && Array.isArray(fig.data) && fig.data.length > 0 && fig.data.every((t) => SCENE_TYPES.has(t.type));
}

// --- small vector helpers (3-element arrays) ---------------------------------
const dot = (a, b) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a, b) => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const norm = (a) => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return n > 0 ? [a[0] / n, a[1] / n, a[2] / n] : [0, 0, 0];
};
const xyz = (o, fallback) => (o && [+o.x || 0, +o.y || 0, +o.z || 0]) || fallback;

// Camera as a turntable: `up` is the scene's vertical; the view direction
// (from the centre toward the viewer) is given by azimuth `theta` round `up`
// from the reference direction `a`, and elevation `phi` above the horizontal.
function cameraFromLayout(scene) {
  const cam = (scene && scene.camera) || {};
  let up = norm(xyz(cam.up, [0, 0, 1]));
  if (!dot(up, up)) up = [0, 0, 1];
  const center = xyz(cam.center, [0, 0, 0]);
  let eye = xyz(cam.eye, [1.25, 1.25, 1.25]);
  let d = norm([eye[0] - center[0], eye[1] - center[1], eye[2] - center[2]]);
  if (!dot(d, d)) d = norm([1, 1, 1]);
  const phi = Math.asin(Math.max(-1, Math.min(1, dot(d, up))));
  let a = [d[0] - dot(d, up) * up[0], d[1] - dot(d, up) * up[1], d[2] - dot(d, up) * up[2]];
  if (Math.hypot(a[0], a[1], a[2]) < 1e-9) a = Math.abs(up[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  a = norm([a[0] - dot(a, up) * up[0], a[1] - dot(a, up) * up[1], a[2] - dot(a, up) * up[2]]);
  return { up, a, b: cross(up, a), theta: 0, phi: Math.max(-MAX_ELEVATION, Math.min(MAX_ELEVATION, phi)), zoom: 1 };
}

// Screen basis of a camera: right, screen-up, and toward-viewer unit vectors.
function viewBasis(cam) {
  const c = Math.cos(cam.phi);
  const h = [0, 1, 2].map((i) => Math.cos(cam.theta) * cam.a[i] + Math.sin(cam.theta) * cam.b[i]);
  const toward = norm([0, 1, 2].map((i) => c * h[i] + Math.sin(cam.phi) * cam.up[i]));
  const right = norm(cross(cam.up, toward));
  return { right, screenUp: cross(toward, right), toward };
}

// Number of points in a coordinate array and its value at k (NaN for a gap).
const at = (arr, k) => {
  const v = arr ? arr[k] : NaN;
  return v === null || v === undefined ? NaN : +v;
};

// Bounds and per-axis scales of the data -> normalised scene box.
function sceneBox(data, scene) {
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  for (const t of data) {
    if (t.visible === false) continue;
    const n = Math.min(len(t.x), len(t.y), len(t.z));
    for (let k = 0; k < n; k++) {
      const p = [at(t.x, k), at(t.y, k), at(t.z, k)];
      if (!(p[0] === p[0] && p[1] === p[1] && p[2] === p[2])) continue;
      for (let i = 0; i < 3; i++) {
        if (p[i] < lo[i]) lo[i] = p[i];
        if (p[i] > hi[i]) hi[i] = p[i];
      }
    }
  }
  if (!(lo[0] <= hi[0])) return { lo: [-1, -1, -1], hi: [1, 1, 1], mid: [0, 0, 0], scale: [1, 1, 1] };
  const half = [0, 1, 2].map((i) => Math.max((hi[i] - lo[i]) / 2, 1e-12));
  const mid = [0, 1, 2].map((i) => (hi[i] + lo[i]) / 2);
  const big = Math.max(...half);
  const mode = (scene && scene.aspectmode) || "auto";
  let scale;
  if (mode === "cube") scale = half.map((h) => 1 / h);
  else if (mode === "manual" && scene.aspectratio) {
    const ar = xyz(scene.aspectratio, [1, 1, 1]).map((v) => Math.max(v, 1e-6));
    const m = Math.max(...ar);
    scale = half.map((h, i) => ar[i] / m / h);
  } else if (mode === "auto" && Math.max(...half) > 4 * Math.min(...half)) scale = half.map((h) => 1 / h);
  else scale = [1 / big, 1 / big, 1 / big];
  return { lo, hi, mid, scale };
}

function len(arr) {
  return arr && typeof arr.length === "number" ? arr.length : 0;
}

// "#rgb", "#rrggbb", "rgb()", "rgba()" or a CSS name -> [r, g, b, a].
const colorCache = new Map();
function rgba(color) {
  if (typeof color !== "string" || !color) return [90, 90, 90, 1];
  if (colorCache.has(color)) return colorCache.get(color);
  let out = null;
  const hex = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(color.trim());
  if (hex) {
    const h = hex[1].length === 3 ? hex[1].replace(/./g, "$&$&") : hex[1];
    out = [parseInt(h.slice(0, 2), 16), parseInt(h.slice(2, 4), 16), parseInt(h.slice(4, 6), 16), 1];
  } else {
    const m = /^rgba?\(([^)]*)\)$/i.exec(color.trim());
    if (m) {
      const p = m[1].split(",").map((s) => parseFloat(s));
      out = [p[0] || 0, p[1] || 0, p[2] || 0, p.length > 3 && p[3] === p[3] ? p[3] : 1];
    } else {
      const ctx = document.createElement("canvas").getContext("2d"); // the browser parses a CSS name
      ctx.fillStyle = "#5a5a5a";
      ctx.fillStyle = color;
      out = rgba(ctx.fillStyle);
    }
  }
  colorCache.set(color, out);
  return out;
}

const css = (c, alpha) => `rgba(${c[0] | 0},${c[1] | 0},${c[2] | 0},${+(c[3] * alpha).toFixed(3)})`;

// Text from the spec goes into the page as text, never as HTML; <br> breaks lines.
function setLines(node, text) {
  node.textContent = "";
  String(text === undefined || text === null ? "" : text)
    .split(/<br\s*\/?>/i)
    .forEach((line, i) => {
      if (i) node.appendChild(document.createElement("br"));
      node.appendChild(document.createTextNode(line.replace(/<[^>]*>/g, "")));
    });
}

const plainText = (t) => String(t && typeof t === "object" ? t.text || "" : t || "").replace(/<[^>]*>/g, " ");

// Round tick values (1, 2, 5 x 10^k) that fall inside [lo, hi].
function ticks(lo, hi, count) {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / count;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw) || 10 * p;
  const out = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

const tickLabel = (v) => (Math.abs(v) >= 1000 ? v.toFixed(0) : String(+v.toPrecision(4)));

class SceneView {
  constructor(parent) {
    this.root = document.createElement("div");
    this.root.className = "loadscope-scene";
    this.root.style.cssText = "position:relative;box-sizing:border-box;user-select:none;";
    this.title = document.createElement("div");
    this.title.className = "loadscope-scene-title";
    this.legend = document.createElement("div");
    this.legend.className = "loadscope-scene-legend";
    this.legend.style.cssText = "display:flex;flex-wrap:wrap;gap:4px 14px;padding:2px 8px 6px;";
    this.canvas = document.createElement("canvas");
    this.canvas.style.cssText = "display:block;width:100%;cursor:grab;touch-action:none;";
    this.canvas.setAttribute("role", "img");
    this.tip = document.createElement("div");
    this.tip.className = "loadscope-scene-hover";
    this.tip.style.cssText =
      "position:absolute;display:none;pointer-events:none;padding:4px 7px;border-radius:3px;" +
      "font-size:12px;line-height:1.35;max-width:420px;box-shadow:0 1px 4px rgba(0,0,0,.25);";
    this.notes = document.createElement("div");
    this.notes.className = "loadscope-scene-notes";
    this.notes.style.cssText = "display:flex;flex-wrap:wrap;justify-content:space-between;gap:4px 16px;padding:2px 8px;";
    this.root.append(this.title, this.legend, this.canvas, this.tip, this.notes);
    parent.appendChild(this.root);

    this.fig = null;
    this.cam = null;
    this.home = null; // the layout's camera, for double-click
    this.uirev = undefined;
    this.shown = new Map(); // legend group -> on/off chosen by a legend click
    this.frame = null; // projected geometry of the last draw (for hover)
    this.pending = 0;
    this._listen();
    this.resize = new ResizeObserver(() => this.fig && this.requestDraw());
    this.resize.observe(this.root);
  }

  // A new figure (whole or after a delta): keep the user's camera while
  // uirevision stays, and a legend choice while the spec keeps that group's visibility.
  update(fig) {
    const layout = fig.layout || {};
    const scene = layout.scene || {};
    const uirev = scene.uirevision !== undefined ? scene.uirevision : layout.uirevision;
    if (!this.cam || uirev === undefined || uirev !== this.uirev) {
      this.home = cameraFromLayout(scene);
      this.cam = Object.assign({}, this.home);
      this.shown.clear();
    } else if (this.fig) {
      const before = new Map(this.fig.data.map((t, i) => [groupOf(t, i), t.visible]));
      fig.data.forEach((t, i) => {
        if (before.get(groupOf(t, i)) !== t.visible) this.shown.delete(groupOf(t, i));
      });
    }
    this.uirev = uirev;
    this.fig = fig;
    this._chrome(layout);
    this._legend();
    this.draw();
  }

  isOn(t, i) {
    if (t.visible === false) return false;
    const g = groupOf(t, i);
    return this.shown.has(g) ? this.shown.get(g) : t.visible !== "legendonly";
  }

  _chrome(layout) {
    const font = layout.font || {};
    this.font = { family: font.family || "sans-serif", size: +font.size || 12, color: font.color || "#333" };
    this.paper = layout.paper_bgcolor || "#fff";
    const scene = layout.scene || {};
    this.plot = (scene.xaxis && scene.xaxis.backgroundcolor) || layout.plot_bgcolor || this.paper;
    this.grid = (scene.xaxis && scene.xaxis.gridcolor) || "#ddd";
    this.faint = (scene.xaxis && scene.xaxis.zerolinecolor) || "#777";
    this.axisTitles = ["xaxis", "yaxis", "zaxis"].map((k) => plainText(scene[k] && scene[k].title).trim());
    Object.assign(this.root.style, {
      background: this.paper,
      color: this.font.color,
      fontFamily: this.font.family,
      fontSize: this.font.size + "px",
    });
    this.title.style.cssText = `padding:8px 8px 4px;font-size:${Math.round(this.font.size * 1.35)}px;`;
    setLines(this.title, plainText(layout.title));
    this.canvas.setAttribute("aria-label", "3D view: " + plainText(layout.title) + " (drag to turn, wheel to zoom)");
    const right = (a) => a.xanchor === "right" || a.x >= 1;
    const notes = (layout.annotations || []).filter((a) => a && a.text).sort((a, b) => right(a) - right(b));
    this.notes.textContent = "";
    for (const a of notes) {
      const n = document.createElement("div");
      const f = a.font || {};
      n.style.cssText = `font-size:${+f.size || this.font.size - 1}px;color:${f.color || this.font.color};` +
        (right(a) ? "text-align:right;margin-left:auto;" : "text-align:left;");
      setLines(n, a.text);
      this.notes.appendChild(n);
    }
    this.tip.style.background = this.paper;
    this.tip.style.border = `1px solid ${this.grid}`;
    this.height = Math.max(240, (+layout.height || 500) - 120);
  }

  _legend() {
    const seen = new Set();
    this.legend.textContent = "";
    this.fig.data.forEach((t, i) => {
      if (t.visible === false || t.showlegend === false) return;
      const g = groupOf(t, i);
      if (seen.has(g)) return;
      seen.add(g);
      const on = this.isOn(t, i);
      const item = document.createElement("button");
      item.type = "button";
      item.className = "loadscope-scene-legend-item";
      item.dataset.group = g;
      item.setAttribute("aria-pressed", String(on));
      item.style.cssText =
        "display:inline-flex;align-items:center;gap:6px;border:0;background:none;cursor:pointer;padding:2px 0;" +
        `font:inherit;color:inherit;opacity:${on ? 1 : 0.45};`;
      const sw = document.createElement("span");
      const col = (t.line && t.line.color) || (t.marker && t.marker.color) || t.color || this.faint;
      sw.style.cssText = `display:inline-block;width:18px;height:${t.type === "mesh3d" ? 10 : 4}px;` +
        `background:${on ? col : "transparent"};border:1.5px solid ${col};border-radius:2px;`;
      const label = document.createElement("span");
      setLines(label, t.name || `trace ${i}`);
      item.append(sw, label);
      item.addEventListener("click", () => {
        this.shown.set(g, !on);
        this._legend();
        this.draw();
      });
      this.legend.appendChild(item);
    });
  }

  requestDraw() {
    if (this.pending) return;
    this.pending = requestAnimationFrame(() => {
      this.pending = 0;
      this.draw();
    });
  }

  // One full repaint of the canvas from this.fig and this.cam.
  draw() {
    if (!this.fig) return;
    const dpr = window.devicePixelRatio || 1;
    const w = Math.max(200, this.root.clientWidth || 800);
    const h = this.height;
    if (this.canvas.width !== Math.round(w * dpr) || this.canvas.height !== Math.round(h * dpr)) {
      this.canvas.width = Math.round(w * dpr);
      this.canvas.height = Math.round(h * dpr);
      this.canvas.style.height = h + "px";
    }
    const ctx = this.canvas.getContext("2d");
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.fillStyle = this.plot;
    ctx.fillRect(0, 0, w, h);

    const scene = (this.fig.layout && this.fig.layout.scene) || {};
    const box = sceneBox(this.fig.data, scene);
    const v = viewBasis(this.cam);
    const reach = Math.hypot(...[0, 1, 2].map((i) => (box.hi[i] - box.lo[i]) / 2 * box.scale[i])) || 1;
    const k = (this.cam.zoom * 0.92 * Math.min(w, h * 1.15)) / 2 / reach; // px per scene unit
    const cx = w / 2;
    const cy = h / 2;
    // data point -> [screen x, screen y, depth toward the viewer]
    const project = (x, y, z) => toScreen((x - box.mid[0]) * box.scale[0], (y - box.mid[1]) * box.scale[1],
      (z - box.mid[2]) * box.scale[2]);
    // scene-unit point -> the same
    const toScreen = (q0, q1, q2) => {
      return [
        cx + k * (q0 * v.right[0] + q1 * v.right[1] + q2 * v.right[2]),
        cy - k * (q0 * v.screenUp[0] + q1 * v.screenUp[1] + q2 * v.screenUp[2]),
        q0 * v.toward[0] + q1 * v.toward[1] + q2 * v.toward[2],
      ];
    };
    this._axes(ctx, box, project);

    // Light from the viewer's upper left, a little in front.
    const light = norm([0, 1, 2].map((i) => -0.45 * v.right[i] + 0.6 * v.screenUp[i] + 0.75 * v.toward[i]));
    const prims = []; // {d: depth, kind, ...}
    const frame = { lines: [], points: [], tris: [] };
    this.fig.data.forEach((t, ti) => {
      if (!this.isOn(t, ti)) return;
      const n = Math.min(len(t.x), len(t.y), len(t.z));
      const sx = new Float32Array(n);
      const sy = new Float32Array(n);
      const sd = new Float32Array(n);
      const q = [new Float32Array(n), new Float32Array(n), new Float32Array(n)]; // scene units
      for (let p = 0; p < n; p++) {
        const x = at(t.x, p);
        const y = at(t.y, p);
        const z = at(t.z, p);
        if (x === x && y === y && z === z) {
          q[0][p] = (x - box.mid[0]) * box.scale[0];
          q[1][p] = (y - box.mid[1]) * box.scale[1];
          q[2][p] = (z - box.mid[2]) * box.scale[2];
          [sx[p], sy[p], sd[p]] = toScreen(q[0][p], q[1][p], q[2][p]);
        } else sx[p] = NaN;
      }
      const hover = t.hoverinfo !== "skip" && t.hoverinfo !== "none";
      if (t.type === "mesh3d") this._meshPrims(t, ti, n, sx, sy, sd, q, light, prims, hover ? frame : null);
      else this._scatterPrims(t, ti, n, sx, sy, sd, prims, hover ? frame : null);
    });
    prims.sort((a, b) => a.d - b.d);
    ctx.lineJoin = "round";
    for (const p of prims) {
      if (p.kind === "tri") {
        ctx.beginPath();
        ctx.moveTo(p.x0, p.y0);
        ctx.lineTo(p.x1, p.y1);
        ctx.lineTo(p.x2, p.y2);
        ctx.closePath();
        ctx.fillStyle = p.fill;
        ctx.fill();
        if (p.seam) {
          // an opaque facet's edge in its own colour hides the anti-aliasing seams between facets
          ctx.strokeStyle = p.fill;
          ctx.lineWidth = 0.8;
          ctx.setLineDash([]);
          ctx.stroke();
        }
      } else if (p.kind === "seg") {
        ctx.beginPath();
        ctx.moveTo(p.x0, p.y0);
        ctx.lineTo(p.x1, p.y1);
        ctx.strokeStyle = p.color;
        ctx.lineWidth = p.width;
        ctx.lineCap = p.dash ? "butt" : "round";
        ctx.setLineDash(p.dash || []);
        ctx.stroke();
      } else if (p.kind === "mark") {
        marker(ctx, p);
      } else if (p.kind === "text") {
        ctx.fillStyle = p.color;
        ctx.font = `${p.size}px ${this.font.family}`;
        ctx.textAlign = "center";
        ctx.textBaseline = "bottom";
        ctx.fillText(p.text, p.x, p.y - 4);
      }
    }
    ctx.setLineDash([]);
    this.frame = frame;
  }

  _meshPrims(t, ti, n, sx, sy, sd, q, light, prims, frame) {
    const I = t.i || [];
    const J = t.j || [];
    const K = t.k || [];
    const base = rgba(t.color || "#8c97a8");
    const opacity = t.opacity === undefined ? 1 : +t.opacity;
    const lit = t.lighting || {};
    const ambient = lit.ambient === undefined ? 0.55 : +lit.ambient;
    const diffuse = lit.diffuse === undefined ? 0.6 : +lit.diffuse;
    const seam = opacity * base[3] >= 0.99;
    const nt = Math.min(I.length, J.length, K.length);
    for (let f = 0; f < nt; f++) {
      const a = I[f];
      const b = J[f];
      const c = K[f];
      if (!(a < n && b < n && c < n) || sx[a] !== sx[a] || sx[b] !== sx[b] || sx[c] !== sx[c]) continue;
      // facet normal in scene units (two-sided: the winding is not known)
      const ab = [q[0][b] - q[0][a], q[1][b] - q[1][a], q[2][b] - q[2][a]];
      const ac = [q[0][c] - q[0][a], q[1][c] - q[1][a], q[2][c] - q[2][a]];
      const nrm = norm(cross(ab, ac));
      const shade = Math.min(1.12, ambient + diffuse * Math.abs(dot(nrm, light)));
      const fill = css([base[0] * shade, base[1] * shade, base[2] * shade, base[3]].map((x, q) => (q < 3 ? Math.min(255, x) : x)), opacity);
      const d = (sd[a] + sd[b] + sd[c]) / 3;
      prims.push({ kind: "tri", d, fill, seam, x0: sx[a], y0: sy[a], x1: sx[b], y1: sy[b], x2: sx[c], y2: sy[c] });
      if (frame) frame.tris.push({ ti, v: a, d, x0: sx[a], y0: sy[a], x1: sx[b], y1: sy[b], x2: sx[c], y2: sy[c] });
    }
  }

  _scatterPrims(t, ti, n, sx, sy, sd, prims, frame) {
    const mode = t.mode || (n < 20 ? "lines+markers" : "lines");
    const opacity = t.opacity === undefined ? 1 : +t.opacity;
    if (mode.includes("lines")) {
      const line = t.line || {};
      const color = css(rgba(line.color || "#444"), opacity);
      const width = line.width === undefined ? 2 : +line.width;
      const dash = typeof line.dash === "string" ? DASHES[line.dash] || parseDash(line.dash) : null;
      for (let p = 0; p + 1 < n; p++) {
        if (sx[p] !== sx[p] || sx[p + 1] !== sx[p + 1]) continue;
        const seg = { x0: sx[p], y0: sy[p], x1: sx[p + 1], y1: sy[p + 1] };
        prims.push({ kind: "seg", d: (sd[p] + sd[p + 1]) / 2, color, width, dash, ...seg });
        if (frame) frame.lines.push({ ti, v: p, w: p + 1, d: Math.max(sd[p], sd[p + 1]), reach: width / 2, ...seg });
      }
    }
    if (mode.includes("markers")) {
      const m = t.marker || {};
      const size = m.size === undefined ? 6 : +m.size;
      const mo = m.opacity === undefined ? opacity : +m.opacity * opacity;
      for (let p = 0; p < n; p++) {
        if (sx[p] !== sx[p]) continue;
        const c = Array.isArray(m.color) ? m.color[p] : m.color;
        prims.push({ kind: "mark", d: sd[p], x: sx[p], y: sy[p], size, symbol: m.symbol || "circle", color: css(rgba(c || "#444"), mo) });
        if (frame) frame.points.push({ ti, v: p, d: sd[p], x: sx[p], y: sy[p], reach: size / 2 });
      }
    }
    if (mode.includes("text") && t.text !== undefined) {
      const f = t.textfont || {};
      const color = css(rgba(f.color || this.font.color), opacity);
      for (let p = 0; p < n; p++) {
        const text = Array.isArray(t.text) ? t.text[p] : t.text;
        if (sx[p] !== sx[p] || !text) continue;
        prims.push({ kind: "text", d: sd[p], x: sx[p], y: sy[p], text: plainText(text), color, size: +f.size || this.font.size });
      }
    }
  }

  // Three axes along the box edges through its low corner, with round ticks,
  // and a light grid on the floor (the plane across the up axis).
  _axes(ctx, box, project) {
    const { lo, hi } = box;
    ctx.font = `${Math.max(10, this.font.size - 2)}px ${this.font.family}`;
    const upAxis = [0, 1, 2].reduce((best, i) => (Math.abs(this.cam.up[i]) > Math.abs(this.cam.up[best]) ? i : best), 0);
    const floor = [0, 1, 2].filter((i) => i !== upAxis);
    const pt = (i, val, j, jval) => {
      const p = lo.slice();
      p[i] = val;
      if (j !== undefined) p[j] = jval;
      return project(p[0], p[1], p[2]);
    };
    ctx.lineWidth = 1;
    ctx.strokeStyle = this.grid;
    for (const [i, j] of [floor, [floor[1], floor[0]]]) {
      for (const tv of ticks(lo[i], hi[i], 5)) {
        const a = pt(i, tv);
        const b = pt(i, tv, j, hi[j]);
        ctx.beginPath();
        ctx.moveTo(a[0], a[1]);
        ctx.lineTo(b[0], b[1]);
        ctx.stroke();
      }
    }
    const labelColor = this.faint;
    for (let i = 0; i < 3; i++) {
      const a = pt(i, lo[i]);
      const b = pt(i, hi[i]);
      ctx.strokeStyle = labelColor;
      ctx.beginPath();
      ctx.moveTo(a[0], a[1]);
      ctx.lineTo(b[0], b[1]);
      ctx.stroke();
      ctx.fillStyle = labelColor;
      ctx.textAlign = "center";
      ctx.textBaseline = "middle";
      const tk = ticks(lo[i], hi[i], 4);
      for (const tv of tk) {
        const p = pt(i, tv);
        ctx.fillText(tickLabel(tv), p[0] - 14 * (i === upAxis ? 1 : 0), p[1] + (i === upAxis ? 0 : 11));
      }
      const dx = b[0] - a[0];
      const dy = b[1] - a[1];
      const l = Math.hypot(dx, dy) || 1;
      ctx.fillStyle = this.font.color;
      ctx.fillText(this.axisTitles[i] || "xyz"[i], b[0] + (dx / l) * 26, b[1] + (dy / l) * 16);
    }
  }

  _listen() {
    const c = this.canvas;
    let drag = null;
    c.addEventListener("pointerdown", (e) => {
      drag = { x: e.clientX, y: e.clientY };
      c.setPointerCapture(e.pointerId);
      c.style.cursor = "grabbing";
      this._hideTip();
    });
    c.addEventListener("pointermove", (e) => {
      if (drag && this.cam) {
        this.cam.theta -= (e.clientX - drag.x) * DRAG_RAD_PER_PX;
        this.cam.phi = Math.max(-MAX_ELEVATION, Math.min(MAX_ELEVATION, this.cam.phi + (e.clientY - drag.y) * DRAG_RAD_PER_PX));
        drag = { x: e.clientX, y: e.clientY };
        this.requestDraw();
      } else {
        this._hover(e);
      }
    });
    const end = (e) => {
      if (!drag) return;
      drag = null;
      c.style.cursor = "grab";
      if (c.hasPointerCapture(e.pointerId)) c.releasePointerCapture(e.pointerId);
    };
    c.addEventListener("pointerup", end);
    c.addEventListener("pointercancel", end);
    c.addEventListener("pointerleave", () => this._hideTip());
    c.addEventListener("wheel", (e) => {
      if (!this.cam) return;
      e.preventDefault();
      const z = this.cam.zoom * Math.exp(-e.deltaY * 0.0015);
      this.cam.zoom = Math.max(ZOOM_LIMITS[0], Math.min(ZOOM_LIMITS[1], z));
      this.requestDraw();
    }, { passive: false });
    c.addEventListener("dblclick", () => {
      if (!this.home) return;
      this.cam = Object.assign({}, this.home);
      this.requestDraw();
    });
  }

  // The hover text of the nearest line or point within HOVER_PX, else of the
  // front-most facet under the pointer.
  _hover(e) {
    if (!this.frame || !this.fig) return;
    const r = this.canvas.getBoundingClientRect();
    const x = e.clientX - r.left;
    const y = e.clientY - r.top;
    let best = null;
    let bestDist = Infinity;
    for (const s of this.frame.lines) {
      const dx = s.x1 - s.x0;
      const dy = s.y1 - s.y0;
      const l2 = dx * dx + dy * dy;
      const u = l2 > 0 ? Math.max(0, Math.min(1, ((x - s.x0) * dx + (y - s.y0) * dy) / l2)) : 0;
      const dist = Math.hypot(x - s.x0 - u * dx, y - s.y0 - u * dy) - s.reach;
      if (dist <= HOVER_PX && (dist < bestDist - 0.5 || (Math.abs(dist - bestDist) <= 0.5 && s.d > best.d))) {
        best = { ti: s.ti, v: u < 0.5 ? s.v : s.w, d: s.d };
        bestDist = dist;
      }
    }
    for (const p of this.frame.points) {
      const dist = Math.hypot(x - p.x, y - p.y) - p.reach;
      if (dist <= HOVER_PX && (dist < bestDist - 0.5 || (Math.abs(dist - bestDist) <= 0.5 && p.d > best.d))) {
        best = p;
        bestDist = dist;
      }
    }
    if (!best) {
      for (const t of this.frame.tris) {
        if ((!best || t.d > best.d) && inside(x, y, t)) best = t;
      }
    }
    const text = best ? hoverText(this.fig.data[best.ti], best.v) : "";
    if (!text) return this._hideTip();
    setLines(this.tip, text);
    this.tip.style.display = "block";
    const box = this.root.getBoundingClientRect();
    const left = e.clientX - box.left + 14;
    const tw = this.tip.offsetWidth;
    this.tip.style.left = Math.max(0, left + tw > box.width ? left - tw - 28 : left) + "px";
    this.tip.style.top = Math.max(0, e.clientY - box.top + 12) + "px";
  }

  _hideTip() {
    this.tip.style.display = "none";
  }

  destroy() {
    this.resize.disconnect();
    if (this.pending) cancelAnimationFrame(this.pending);
    this.root.remove();
  }
}

function groupOf(t, i) {
  return t.legendgroup ? "g:" + t.legendgroup : "t:" + i;
}

function hoverText(t, v) {
  const h = t.hovertext !== undefined ? t.hovertext : t.text;
  const s = Array.isArray(h) ? h[v] : h;
  return s === undefined || s === null ? "" : String(s);
}

function inside(x, y, t) {
  const s1 = (t.x1 - t.x0) * (y - t.y0) - (t.y1 - t.y0) * (x - t.x0);
  const s2 = (t.x2 - t.x1) * (y - t.y1) - (t.y2 - t.y1) * (x - t.x1);
  const s3 = (t.x0 - t.x2) * (y - t.y2) - (t.y0 - t.y2) * (x - t.x2);
  return (s1 >= 0 && s2 >= 0 && s3 >= 0) || (s1 <= 0 && s2 <= 0 && s3 <= 0);
}

function parseDash(s) {
  const parts = s.split(/[ ,]+/).map((p) => parseFloat(p)).filter((p) => p > 0);
  return parts.length ? parts : null;
}

function marker(ctx, p) {
  const r = p.size / 2;
  ctx.beginPath();
  if (p.symbol.startsWith("diamond")) {
    ctx.moveTo(p.x, p.y - r * 1.3);
    ctx.lineTo(p.x + r, p.y);
    ctx.lineTo(p.x, p.y + r * 1.3);
    ctx.lineTo(p.x - r, p.y);
    ctx.closePath();
  } else if (p.symbol.startsWith("square")) {
    ctx.rect(p.x - r, p.y - r, 2 * r, 2 * r);
  } else {
    ctx.arc(p.x, p.y, r, 0, 2 * Math.PI);
  }
  if (p.symbol.endsWith("-open")) {
    ctx.strokeStyle = p.color;
    ctx.lineWidth = 1.5;
    ctx.stroke();
  } else {
    ctx.fillStyle = p.color;
    ctx.fill();
  }
}
