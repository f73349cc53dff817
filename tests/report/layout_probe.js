// Injected by render_check.sh into a COPY of report.html (the report itself carries no script).
// Writes two results into the page for --dump-dom: every element whose box leaves the page width
// or whose content overflows its table cell (clipping), and the boxes of the first solid
// (EXCEEDS/FAIL) and outlined (WITHIN/PASS) badges for the greyscale check.
window.addEventListener('load', function () {
  var W = document.documentElement.clientWidth, bad = [];
  var all = document.querySelectorAll('body *');
  for (var i = 0; i < all.length; ++i) {
    var e = all[i], r = e.getBoundingClientRect();
    if (r.width === 0 && r.height === 0) continue;
    var name = e.tagName + (e.id ? '#' + e.id : '');
    if (r.right > W + 0.5 || r.left < -0.5) bad.push(name + ' [' + Math.round(r.left) + ',' + Math.round(r.right) + ']');
    if ((e.tagName === 'TD' || e.tagName === 'TH') && e.scrollWidth > e.clientWidth + 1) bad.push(name + ' overflows its cell');
  }
  var out = document.createElement('pre');
  out.id = 'clip-result';
  out.textContent = bad.length ? 'CLIPPED ' + W + ' ' + bad.slice(0, 12).join('; ') : 'OK ' + W;
  document.body.appendChild(out);
  var rects = [];
  ['.verdict.bad', '.verdict.good'].forEach(function (sel) {
    var b = document.querySelector(sel);
    if (!b) return;
    var r = b.getBoundingClientRect();
    rects.push([Math.round(r.left + window.scrollX), Math.round(r.top + window.scrollY), Math.round(r.width),
                Math.round(r.height)].join(','));
  });
  var br = document.createElement('pre');
  br.id = 'badge-rects';
  br.textContent = rects.join(';');
  document.body.appendChild(br);
});
