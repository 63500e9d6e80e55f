// The app's first reads, started by this small script as soon as the page is parsed, while the app's
// own code is still arriving and starting: who is signed in and, on a study's address, the study, its
// branches and its draft. Without it they come in rounds after the app has started: the sign-in check,
// then the study and its branches, then the draft.
//
// The app takes each answer once, for the same GET of the same address (core/early-reads.ts); it asks
// the server itself for anything not here. So a wrong guess here costs a wasted read, never a wrong
// screen.
//
// A plain script (angular.json "scripts"), not a module: it runs before the module graph has loaded.
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
    // The branch this address opened last time, remembered here: its draft is read beside the study
    // rather than after the branches have answered. A branch keeps its id, so this is right unless
    // the branch has gone, and then the app never asks for that address and the read is only wasted.
    var rememberKey = 'laminote.openedBranch:' + studyId + ':' + (wanted || '');
    var remembered = null;
    try {
      remembered = localStorage.getItem(rememberKey);
    } catch (e) {}
    var readStudy = function () {
      read('/api/studies/' + studyId);
      if (remembered) read('/api/branches/' + remembered + '/draft');
      return json(read('/api/studies/' + studyId + '/branches'));
    };
    // The anti-forgery cookie is set at sign-in: with it, the study is read beside the sign-in check
    // rather than after it (it outlives a session that ended, which costs three refused reads at most).
    var signedInBefore = /(?:^|;\s*)XSRF-TOKEN=/.test(document.cookie);
    (signedInBefore
      ? readStudy()
      : json(me).then(function (person) {
          return person ? readStudy() : null;
        })
    )
      .then(function (branches) {
        if (!Array.isArray(branches)) return;
        // The branch the notebook opens (notebook-page.ts, pickBranch): the one named or, without a
        // name, main. Anything else is left to the app.
        var branch = branches.find(function (b) {
          return wanted ? b.id === wanted || b.name === wanted : b.name === 'main';
        });
        if (!branch) return;
        if (branch.id !== remembered) read('/api/branches/' + branch.id + '/draft');
        try {
          localStorage.setItem(rememberKey, branch.id);
        } catch (e) {}
      })
      .catch(function () {});
    // The notebook's code beyond main's (its page, the cell bodies and what they import), listed in
    // index.html by the build (scripts/lib/web-build.ts): asked for now, all at once, rather than a
    // level of imports at a time once main has run. At low priority, after the reads above: over the
    // six connections a browser keeps to a server, the draft's read is not queued behind them.
    try {
      var code = document.createDocumentFragment();
      JSON.parse(document.getElementById('lam-study-code').textContent).forEach(function (file) {
        var link = document.createElement('link');
        link.rel = 'modulepreload';
        link.fetchPriority = 'low';
        link.href = file;
        code.appendChild(link);
      });
      document.head.appendChild(code);
    } catch (e) {}
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
