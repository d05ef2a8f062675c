// Starts the WebAssembly app. A separate file rather than an inline script, so the page's
// Content-Security-Policy can stay at script-src 'self' without a hash to keep in step.
import init from './doubleprime-web.js';

const status = document.getElementById('boot-status');

init()
  .then(() => status?.remove())
  .catch((error) => {
    // Without this the page would stay on "Loading" with the reason only in the console.
    console.error(error);
    if (status) {
      status.textContent = `Doubleprime could not start in this browser: ${error}`;
      status.classList.add('boot-status-failed');
    }
  });
