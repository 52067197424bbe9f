// Makes the site work offline after the first visit: registers the service worker the builder
// wrote into the site's root (`sw.js`), once the page has loaded so that caching the whole site
// never delays the first view. Resolved against this script, so the site works under any
// sub-path of a host. Opened from disk (file://) there is no service worker; nothing is done.

function register() {
  const root = new URL("../", import.meta.url);
  navigator.serviceWorker.register(new URL("sw.js", root), { type: "module", scope: root.href }).catch((error) => {
    console.warn("Modebench: offline use is not available in this browser.", error);
  });
}

if ("serviceWorker" in navigator && window.isSecureContext && location.protocol !== "file:") {
  if (document.readyState === "complete") {
    register();
  } else {
    window.addEventListener("load", register, { once: true });
  }
}
