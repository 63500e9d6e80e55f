// The app's first reads, started by this small script as soon as the page is parsed, while the app's
// own code is still arriving and starting: who is signed in and, on a study's address, the study with
// its branches and its draft (one read). Without it they come after the app has started.
//
// The app takes each answer once, for the same GET of the same address (core/early-reads.ts); it asks
// the server itself for anything not here. So a wrong guess here costs a wasted read, never a wrong
// screen.
//
// A plain script (angular.json "scripts"), not a module: it runs before the module graph has loaded. The
// build moves it into the head as a plain (not deferred) script (scripts/lib/web-build.ts addPreloads),
// so it runs once the style sheet has loaded, before the body's scripts are asked for.
(function () {
  'use strict';
  var reads = new Map();
  var startedAt = Date.now();
  function read(url) {
    var answer = fetch(url, { credentials: 'same-origin', headers: { accept: 'application/json, text/plain, */*' } }).then(function (response) {
      return response.text().then(function (body) {
        return { status: response.status, statusText: response.statusText, contentType: response.headers.get('content-type'), body: body };
      });
    });
    // A failed read is asked again by the app; nobody waits on this one's failure.
    answer.catch(function () {});
    reads.set(url, answer);
    return answer;
  }
  // Asks for built scripts now, at low priority (after the reads: over the six connections a browser
  // keeps to a server, a read is not queued behind them).
  function preload(files) {
    var links = document.createDocumentFragment();
    files.forEach(function (file) {
      var link = document.createElement('link');
      link.rel = 'modulepreload';
      link.fetchPriority = 'low';
      link.href = file;
      links.appendChild(link);
    });
    document.head.appendChild(links);
  }
  function listed(id) {
    return JSON.parse(document.getElementById(id).textContent);
  }
  function json(answer) {
    return answer.then(function (a) {
      return a.status === 200 ? JSON.parse(a.body) : null;
    });
  }
  var me = read('/api/me');
  var study = /^\/studies\/([0-9a-fA-F-]{36})\/?$/.exec(location.pathname);
  if (study) {
    var studyId = study[1];
    var wanted = new URLSearchParams(location.search).get('branch');
    // The study, its branches and the opened branch's draft in one read (GET …/opening, written as
    // NotebookApi.opening writes it): the branch is chosen by the server, so the draft does not wait
    // for the branches to answer first.
    var readStudy = function () {
      var opening = read('/api/studies/' + studyId + '/opening' + (wanted ? '?branch=' + encodeURIComponent(wanted) : ''));
      // The code of the cell kinds the draft has that does not come with the page (a polar, a sweep…;
      // listed by kind in index.html): asked for as soon as the draft says which kinds it has. The
      // answer's text is searched rather than parsed twice; a kind named elsewhere in it costs a fetch.
      opening
        .then(function (answer) {
          if (answer.status !== 200) return;
          var byKind = listed('lam-kind-code');
          var asked = {};
          var kind = /"kind":"([A-Za-z]+)"/g;
          for (var m = kind.exec(answer.body); m; m = kind.exec(answer.body)) {
            var stem = m[1].replace(/[A-Z]/g, function (c) {
              return '-' + c.toLowerCase();
            });
            if (byKind[stem] && !asked[stem]) {
              asked[stem] = true;
              preload(byKind[stem]);
            }
          }
        })
        .catch(function () {});
    };
    // The anti-forgery cookie is set at sign-in: with it, the study is read beside the sign-in check
    // rather than after it (it outlives a session that ended, which costs a refused read at most).
    var signedInBefore = /(?:^|;\s*)XSRF-TOKEN=/.test(document.cookie);
    if (signedInBefore) readStudy();
    else
      json(me)
        .then(function (person) {
          if (person) readStudy();
        })
        .catch(function () {});
  }
  // The first screen's other fonts (the bold of the titles and the icons): a browser asks for a font
  // only when styled text first needs it, which on a study is half a second after this point. The
  // stylesheet that names them has loaded by now (a script waits for the style sheets before it).
  if (document.fonts && typeof document.fonts.load === 'function') {
    ['700 1em Lato', '1em "Laminote Symbols"'].forEach(function (font) {
      document.fonts.load(font).catch(function () {});
    });
  }
  window.laminoteEarlyReads = { startedAt: startedAt, reads: reads };
})();
