// Setcard chart frame. Runs inside the <iframe id="chart-frame"> of
// index.html, because the Go program (Ebiten) takes over the whole <body> of
// the document it runs in.
//
// It probes for WebGL, tells the Go program through globalThis.setcardNoGL
// when there is none (the Go program then draws nothing itself and the page
// shows core.chartSVG instead), and starts setcard.wasm. The Go program
// registers globalThis.setcardCore here and calls parent.setcardHost.
// Any failure to start is reported to parent.setcardHost.coreFailed, and
// kept in globalThis.setcardFailed for a page that was not listening yet.
"use strict";

(function () {
  const WASM = "setcard.wasm";

  function fail(err) {
    const msg = String(err && err.message ? err.message : err);
    globalThis.setcardFailed = msg;
    try {
      if (window.parent && window.parent !== window && window.parent.setcardHost) {
        window.parent.setcardHost.coreFailed(msg);
      }
    } catch (e) {
      // The parent cannot be reached: it polls setcardFailed instead.
    }
  }

  function hasWebGL() {
    try {
      const canvas = document.createElement("canvas");
      const gl = canvas.getContext("webgl2") || canvas.getContext("webgl");
      if (!gl) {
        return false;
      }
      const lose = gl.getExtension("WEBGL_lose_context");
      if (lose) {
        lose.loseContext();
      }
      return true;
    } catch (e) {
      return false;
    }
  }

  if (!hasWebGL()) {
    globalThis.setcardNoGL = true;
  }

  // The Go program asks for a WebGL context with the browser's default
  // multisampling. It only ever copies its finished frame onto the canvas
  // as one axis-aligned rectangle, which multisampling cannot improve, and
  // under a software renderer it multiplies the cost of every frame. So the
  // canvas's context is made without it.
  const getContext = HTMLCanvasElement.prototype.getContext;
  HTMLCanvasElement.prototype.getContext = function (type, attrs) {
    if (type === "webgl2" || type === "webgl") {
      attrs = Object.assign({}, attrs, {antialias: false});
    }
    return getContext.call(this, type, attrs);
  };

  if (typeof Go !== "function" || typeof WebAssembly !== "object") {
    fail(typeof WebAssembly !== "object" ? "this browser has no WebAssembly" : "wasm_exec.js did not load");
    return;
  }

  const go = new Go();

  function fetchBytes() {
    return fetch(WASM).then((response) => {
      if (!response.ok) {
        throw new Error("loading " + WASM + ": HTTP " + response.status);
      }
      return response.arrayBuffer();
    }).then((bytes) => WebAssembly.instantiate(bytes, go.importObject));
  }

  function instantiate() {
    if (typeof WebAssembly.instantiateStreaming !== "function") {
      return fetchBytes();
    }
    // instantiateStreaming fails when the server sends the wrong MIME type;
    // then read the bytes and try again.
    return WebAssembly.instantiateStreaming(fetch(WASM), go.importObject).catch(fetchBytes);
  }

  instantiate()
    .then((result) => go.run(result.instance))
    .then(() => fail("the chart program stopped"))
    .catch(fail);
})();
