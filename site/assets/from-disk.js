// A page opened from disk (file://): browsers refuse its module scripts there, so its calculator
// can never start, and the note that it soon will would stand for good. This one classic script,
// which browsers do run from disk, marks each calculator as unavailable at once, so that the
// page says it cannot be edited (the style sheet shows that note). Served over HTTP it does
// nothing, and the page's own script decides. The single-file build, made for disk, does not
// load it.

if (location.protocol === "file:") {
  for (const calculator of document.querySelectorAll(".mb-calc")) {
    calculator.setAttribute("data-engine", "unavailable");
  }
}
