// Setcard service worker.
//
// The build (scripts/build) replaces the two placeholders below: the cache
// name becomes "setcard-<build version>" and the file list becomes every URL
// the page needs ("./", "index.html" and each content-hashed asset). A copy
// served straight from site/ keeps the placeholders; it then caches nothing
// and leaves every request to the network.
"use strict";

const CACHE = "__SETCARD_CACHE__";
const FILES = ["__SETCARD_FILES__"];
const PREFIX = "setcard-";
const BUILT = CACHE.startsWith(PREFIX);

function fromCache(request) {
  return caches.open(CACHE).then((cache) => cache.match(request));
}

self.addEventListener("install", (event) => {
  if (!BUILT) {
    self.skipWaiting();
    return;
  }
  // cache: "reload" skips the HTTP cache so that the files stored are the
  // ones of this build.
  const requests = FILES.map((file) => new Request(file, { cache: "reload" }));
  event.waitUntil(
    caches.open(CACHE)
      .then((cache) => cache.addAll(requests))
      .then(() => self.skipWaiting()),
  );
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches.keys()
      .then((names) => Promise.all(
        names
          .filter((name) => name.startsWith(PREFIX) && name !== CACHE)
          .map((name) => caches.delete(name)),
      ))
      .then(() => self.clients.claim()),
  );
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (!BUILT || request.method !== "GET") {
    return;
  }
  if (new URL(request.url).origin !== self.location.origin) {
    return;
  }
  if (request.mode === "navigate") {
    // Network first, so that a new build is seen as soon as it is online;
    // the cached page when offline.
    // A frame's page (the chart) falls back to its own cached copy.
    event.respondWith(
      fetch(request).catch(() => fromCache(request)
        .then((response) => response || fromCache("index.html"))
        .then((response) => response || Response.error())),
    );
    return;
  }
  // Hashed files never change: cache first, then the network.
  event.respondWith(
    fromCache(request).then((response) => response || fetch(request)),
  );
});
