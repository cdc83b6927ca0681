// Test fixture script: loads the WebAssembly core and registers the
// service worker, the way the real page does.
const go = new Go();
const status = document.querySelector(".status");

async function start() {
  const response = await fetch("setcard.wasm");
  const result = await WebAssembly.instantiateStreaming(response, go.importObject);
  status.textContent = "Ready";
  go.run(result.instance);
}

if ("serviceWorker" in navigator) {
  navigator.serviceWorker.register("sw.js").catch((err) => {
    console.warn("service worker not registered", err);
  });
}

const extraStyle = './app.css';
console.debug("stylesheet", extraStyle, `icon.svg`);
start().catch((err) => {
  status.textContent = "Could not start: " + err;
});
