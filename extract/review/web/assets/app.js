// glossmith review page. Plain JavaScript, no library: the table, the detail
// view, the actions and their keys. Every piece of document text reaches the
// page through textContent or a text node, never as markup.
(function () {
  'use strict';

  // ---- the data source: the server (live) or the report's inlined data ----

  function liveSource(token) {
    async function check(r) {
      if (!r.ok) throw new Error((await r.text()).trim() || r.statusText);
      return r.json();
    }
    function get(url) { return tracked(fetch(url, { credentials: 'same-origin' }).then(check)); }
    function post(url, body) {
      return tracked(fetch(url, {
        method: 'POST', credentials: 'same-origin',
        headers: { 'Content-Type': 'application/json', 'X-Glossmith-Token': token },
        body: JSON.stringify(body)
      }).then(check));
    }
    // Changes reach the server one after another, in the order they were
    // made: requests in flight at once may arrive in any order, and an undo
    // must not overtake the merge it is meant to take back.
    let last = Promise.resolve();
    function inTurn(send) {
      const p = last.then(send);
      last = p.catch(() => {});
      return p;
    }
    return {
      live: true,
      load: () => get('api/data'),
      detail: id => get('api/detail?id=' + id),
      more: (id, from) => get('api/contexts?id=' + id + '&from=' + from),
      act: a => inTurn(() => post('api/act', a)),
      undo: () => inTurn(() => post('api/undo', {}))
    };
  }

  // The page is idle (body[data-idle="yes"]) when no request is on its way
  // and the page has drawn what the answers changed. A request counts from
  // the moment it is made until a task after its answer: the answer's own
  // handlers (and any request they start) run first, as promise callbacks.
  // Scripts that drive the page wait for this instead of guessing a delay.
  let pending = 0;
  function tracked(p) {
    setPending(+1);
    const done = () => setTimeout(() => setPending(-1), 0);
    p.then(done, done);
    return p;
  }
  function setPending(d) {
    pending += d;
    document.body.dataset.idle = pending ? 'no' : 'yes';
  }

  // The report keeps the expert's remarks in the browser's storage for this
  // file, and offers them as CSV for `termbase import`. A candidate without
  // a remark's decision shows the termbase's label the report was written
  // with (terms --termbase), if any.
  function reportSource(data) {
    const key = 'glossmith-remarks:' + data.stamp;
    let remarks = {};
    try { remarks = JSON.parse(localStorage.getItem(key) || '{}') || {}; } catch (e) { remarks = {}; }
    const history = [];
    function asDecision(id) {
      const r = remarks[id], c = data.cands[id] || {};
      if (r && r.status) return { status: r.status, note: r.note || '' };
      return { status: c.status || 'new', entry: c.entry || '', note: r && r.note || '' };
    }
    function save() { try { localStorage.setItem(key, JSON.stringify(remarks)); } catch (e) { /* storage off: kept in memory */ } }
    function reviewed() { return data.cands.filter(c => asDecision(c.id).status !== 'new').length; }
    function reply(ids) {
      const changed = {};
      ids.forEach(id => { changed[id] = asDecision(id); });
      return { changed: changed, reviewed: reviewed(), total: data.cands.length };
    }
    const statusOf = { accept: 'accepted', reject: 'rejected', defer: 'deferred' };
    return {
      live: false,
      remarks: remarks,
      load: () => Promise.resolve(Object.assign({}, data, {
        decisions: data.cands.map(c => asDecision(c.id))
      })),
      detail: id => {
        const d = expandDetail(data, id);
        d.decision = asDecision(id);
        return Promise.resolve(d);
      },
      more: () => Promise.resolve({ contexts: [], more: 0 }),
      act: a => {
        const prev = remarks[a.id] ? Object.assign({}, remarks[a.id]) : null;
        history.push([a.id, prev]);
        const r = remarks[a.id] = Object.assign({ status: '', note: '' }, remarks[a.id]);
        if (statusOf[a.kind]) r.status = r.status === statusOf[a.kind] ? '' : statusOf[a.kind];
        else if (a.kind === 'note') r.note = a.text;
        else if (a.kind === 'clear') r.status = '';
        if (!r.status && !r.note) delete remarks[a.id];
        save();
        return Promise.resolve(reply([a.id]));
      },
      undo: () => {
        const h = history.pop();
        if (!h) return Promise.resolve(Object.assign(reply([]), { undone: false }));
        if (h[1]) remarks[h[0]] = h[1]; else delete remarks[h[0]];
        save();
        return Promise.resolve(Object.assign(reply([h[0]]), { undone: true }));
      },
      csv: () => {
        // The columns of a review sheet that `termbase import` reads back as
        // decisions: term, decision (accept, reject, defer), comment.
        const rows = [['term', 'decision', 'comment']];
        const verdict = { accepted: 'accept', rejected: 'reject', deferred: 'defer' };
        data.cands.forEach(c => {
          const r = remarks[c.id];
          if (r && (r.status || r.note)) rows.push([c.term, verdict[r.status] || '', r.note || '']);
        });
        return rows.map(row => row.map(csvCell).join(',')).join('\r\n') + '\r\n';
      }
    };
  }

  function csvCell(s) {
    s = String(s);
    // A cell a spreadsheet would read as a formula is quoted with a lead apostrophe.
    if (/^[=+\-@\t\r]/.test(s)) s = "'" + s;
    return /[",\r\n]/.test(s) ? '"' + s.replace(/"/g, '""') + '"' : s;
  }

  // The report stores each context sentence once: [doc, line, text index].
  function expandDetail(data, id) {
    const d = data.details[id] || {};
    const ctx = (d.contexts || []).map(c => Array.isArray(c) ? { doc: c[0], line: c[1], text: data.texts[c[2]] } : c);
    return Object.assign({}, d, { contexts: ctx, more: 0 });
  }

  // ---- small DOM helpers ----

  function el(tag, attrs, kids) {
    const e = document.createElement(tag);
    if (attrs) {
      for (const k in attrs) {
        const v = attrs[k];
        if (v === undefined || v === null || v === false) continue;
        if (k === 'text') e.textContent = v;
        else if (k === 'class') e.className = v;
        else if (k.startsWith('on')) e.addEventListener(k.slice(2), v);
        else e.setAttribute(k, v === true ? '' : v);
      }
    }
    (kids || []).forEach(c => { if (c !== null && c !== undefined) e.append(c); });
    return e;
  }
  const SVG = 'http://www.w3.org/2000/svg';
  function svg(tag, attrs) {
    const e = document.createElementNS(SVG, tag);
    for (const k in attrs) e.setAttribute(k, attrs[k]);
    return e;
  }
  function fmt(x, d) { return typeof x === 'number' ? x.toFixed(d) : ''; }

  // ---- state ----

  const S = {
    src: null, data: null, decisions: [], view: [], page: 0, pageSize: 100,
    sel: -1, sortKey: 'rank', sortDir: 1,
    filter: { text: '', status: '', pos: '', minFreq: 0 },
    reviewed: 0, detail: null, moreFrom: 0
  };

  const columns = [
    { key: 'rank', label: '#', num: true },
    { key: 'term', label: 'term', text: true },
    { key: 'status', label: 'status', text: true },
    { key: 'freq', label: 'freq', num: true },
    { key: 'docs', label: 'docs', num: true },
    { key: 'score', label: 'score', num: true, d: 2 },
    { key: 'key', label: 'keyness', num: true, d: 1 },
    { key: 'weird', label: 'weirdness', num: true, d: 1 },
    { key: 'cval', label: 'C-value', num: true, d: 2 },
    { key: 'dp', label: 'DP', num: true, d: 2 },
    { key: 'pos', label: 'POS', text: true }
  ];
  const statuses = ['new', 'accepted', 'rejected', 'deferred', 'variant', 'acronym', 'full form', 'deprecated'];

  // ---- the table ----

  function applyView() {
    const f = S.filter, q = f.text.toLowerCase(), cands = S.data.cands;
    const out = [];
    for (let i = 0; i < cands.length; i++) {
      const c = cands[i];
      if (c.freq < f.minFreq) continue;
      if (q && c.term.toLowerCase().indexOf(q) < 0) continue;
      if (f.pos && c.pos !== f.pos) continue;
      if (f.status && S.decisions[i].status !== f.status) continue;
      out.push(i);
    }
    const k = S.sortKey, dir = S.sortDir;
    const val = k === 'status' ? (i => S.decisions[i].status) : (i => cands[i][k]);
    out.sort((a, b) => {
      const x = val(a), y = val(b);
      if (x !== y) return (x < y ? -1 : 1) * dir;
      return cands[a].rank - cands[b].rank;
    });
    S.view = out;
    S.page = Math.min(S.page, Math.max(0, Math.ceil(out.length / S.pageSize) - 1));
    renderTable();
  }

  // relation names how a candidate with an entry other than its own
  // belongs to it: a variant, or the acronym or full form of its term.
  function relation(d) {
    return d.status === 'acronym' || d.status === 'full form' ? d.status : 'variant';
  }

  function statusChip(d) {
    const st = d.status || 'new';
    const chip = el('span', { class: 'chip ' + st.replace(/ /g, '-'), text: st });
    if (d.entry && st !== 'new') chip.title = relation(d) + ' of ' + d.entry;
    return chip;
  }

  function renderRow(i) {
    const c = S.data.cands[i];
    const tr = el('tr', { 'data-id': i, class: i === S.sel ? 'sel' : '' });
    columns.forEach(col => {
      let td;
      if (col.key === 'status') td = el('td', { class: 't' }, [statusChip(S.decisions[i])]);
      else if (col.key === 'term') td = el('td', { class: 't', text: c.term, title: c.term });
      else if (col.key === 'pos') td = el('td', { class: 'p', text: c.pos });
      else td = el('td', { text: col.d ? fmt(c[col.key], col.d) : String(c[col.key]) });
      tr.append(td);
    });
    return tr;
  }

  function renderTable() {
    const tbody = document.getElementById('gs-rows');
    const from = S.page * S.pageSize, rows = S.view.slice(from, from + S.pageSize);
    const frag = document.createDocumentFragment();
    rows.forEach(i => frag.append(renderRow(i)));
    tbody.replaceChildren(frag);
    const pages = Math.max(1, Math.ceil(S.view.length / S.pageSize));
    document.getElementById('gs-page').textContent = 'page ' + (S.page + 1) + ' of ' + pages;
    document.getElementById('gs-shown').textContent = S.view.length + ' of ' + S.data.cands.length + ' shown';
    document.querySelectorAll('.gs-table th').forEach(th => {
      th.setAttribute('aria-sort', th.dataset.key === S.sortKey ? (S.sortDir > 0 ? 'ascending' : 'descending') : 'none');
    });
  }

  function refreshRow(i) {
    const old = document.querySelector('#gs-rows tr[data-id="' + i + '"]');
    if (old) old.replaceWith(renderRow(i));
  }

  function renderCounter() {
    const n = S.data.cands.length;
    const c = document.getElementById('gs-counter');
    c.replaceChildren(document.createTextNode(S.reviewed + ' / ' + n + ' reviewed'),
      el('meter', { min: 0, max: Math.max(n, 1), value: S.reviewed }));
  }

  // ---- selection and the detail view ----

  function select(i, scroll) {
    if (i < 0 || i >= S.data.cands.length) return;
    const prev = S.sel;
    S.sel = i;
    if (prev >= 0) refreshRow(prev);
    refreshRow(i);
    if (scroll) {
      const tr = document.querySelector('#gs-rows tr[data-id="' + i + '"]');
      if (tr) tr.scrollIntoView({ block: 'nearest' });
    }
    S.src.detail(i).then(d => {
      if (S.sel !== i) return;
      S.detail = d;
      S.moreFrom = d.contexts.length;
      if (d.decision) S.decisions[i] = d.decision;
      renderDetail();
    }).catch(showError);
  }

  function move(step) {
    if (!S.view.length) return;
    let pos = S.view.indexOf(S.sel);
    pos = pos < 0 ? 0 : Math.min(S.view.length - 1, Math.max(0, pos + step));
    const page = Math.floor(pos / S.pageSize);
    if (page !== S.page) { S.page = page; renderTable(); }
    select(S.view[pos], true);
  }

  function section(title, body) {
    return [el('h3', { text: title }), body];
  }

  function renderDetail() {
    const pane = document.getElementById('gs-detail');
    const i = S.sel, c = S.data.cands[i], d = S.detail, dec = S.decisions[i];
    const kids = [];
    kids.push(el('h2', null, [el('span', { id: 'gs-term', text: c.term }), statusChip(dec)]));
    kids.push(el('div', { class: 'gs-facts', text:
      'rank ' + c.rank + ' · ' + c.freq + '× in ' + c.docs + ' document(s) · score ' + fmt(c.score, 2) +
      ' · ' + c.words + ' word(s) · ' + c.pos + (dec.entry ? ' · ' + relation(dec) + ' of “' + dec.entry + '”' : '') +
      (c.acr ? ' · acronym “' + c.acr + '” (its uses counted here)' : '') +
      (c.full && !(dec.status === 'acronym' && dec.entry === c.full) ? ' · acronym of “' + c.full + '”' : '') +
      (c.in ? ' · mostly within “' + c.in + '”' : '') +
      (dec.concept && dec.concept.length ? ' · one concept with ' + dec.concept.map(t => '“' + t + '”').join(', ') : '') }));
    kids.push(actionBar());
    if (!S.src.live) kids.push(remarkBox(i));
    if (S.src.live) {
      const notes = el('dl', { class: 'gs-notes' });
      [['definition', dec.definition], ['note', dec.note], ['part of speech', dec.pos], ['preferred form', dec.preferred]].forEach(p => {
        if (p[1]) notes.append(el('dt', { text: p[0] }), el('dd', { text: p[1] }));
      });
      if (notes.childNodes.length) kids.push(notes);
    }
    kids.push(...section('Variants', variantTable(d, dec)));
    kids.push(...section('Spread over the documents', spreadChart(d)));
    const kwic = el('div', { class: 'gs-kwic', id: 'gs-kwic' });
    addLines(kwic, d.contexts, forms(c, d));
    if (!d.contexts.length) kwic.append(el('div', { class: 'gs-empty', text: 'no example sentence kept' }));
    kids.push(...section('Contexts', kwic));
    if (d.more > 0) kids.push(el('button', { class: 'gs-more', id: 'gs-more', text: 'more contexts (' + d.more + ') [c]', onclick: moreContexts }));
    kids.push(...section('Collocates of “' + (d.collocates && d.collocates[0] ? d.collocates[0].head : c.term) + '”', collocates(d)));
    kids.push(...section('Contains', links(d.contains)));
    kids.push(...section('Contained in', links(d.containedIn)));
    pane.replaceChildren(...kids);
  }

  function actionBar() {
    const bar = el('div', { class: 'gs-actions' });
    actions().forEach(a => {
      if (!a.button) return;
      bar.append(el('button', { id: 'gs-do-' + a.id, class: a.cls || '', title: a.help, onclick: a.run }, [a.button, el('kbd', { text: a.key })]));
    });
    return bar;
  }

  function remarkBox(i) {
    const r = S.src.remarks[i] || {};
    const ta = el('textarea', { id: 'gs-remark', placeholder: 'Your remark on this term (kept in this browser; download them as CSV above)' });
    ta.value = r.note || '';
    ta.addEventListener('change', () => act({ id: i, kind: 'note', text: ta.value }));
    return el('div', { class: 'gs-remark' }, [el('div', { text: 'Remark' }), ta]);
  }

  function variantTable(d, dec) {
    const vs = d.variants || [];
    if (!vs.length) return el('div', { class: 'gs-empty', text: 'one form only' });
    const t = el('table', { class: 'gs-variants' });
    vs.forEach(v => {
      const st = dec.forms && dec.forms[v.form];
      t.append(el('tr', null, [el('td', { text: v.form }), el('td', { class: 'n', text: String(v.count) }),
        el('td', null, [st ? el('span', { class: 'chip ' + st, text: st }) : null])]));
    });
    return t;
  }

  // A bar per document, its height the candidate's count there; the title
  // of each bar names the document.
  function spreadChart(d) {
    const docs = S.data.docs, n = docs.length;
    if (!d.perDoc || !d.perDoc.length) return el('div', { class: 'gs-empty', text: 'no counts per document (a recorded run keeps totals only)' });
    const counts = new Array(n).fill(0);
    (d.perDoc || []).forEach(p => { counts[p[0]] = p[1]; });
    const top = Math.max(1, ...counts);
    const W = 600, H = 110, pad = 18, bw = (W - 2 * pad) / Math.max(n, 1);
    const s = svg('svg', { class: 'gs-spread', viewBox: '0 0 ' + W + ' ' + H, preserveAspectRatio: 'none', role: 'img', id: 'gs-spread' });
    s.append(svg('line', { x1: pad, y1: H - pad, x2: W - pad, y2: H - pad }));
    counts.forEach((k, j) => {
      if (!k) return;
      const h = (H - 2 * pad) * k / top;
      const r = svg('rect', { class: 'bar', x: pad + j * bw + bw * 0.1, y: H - pad - h, width: Math.max(bw * 0.8, 0.8), height: h });
      const title = svg('title', {});
      title.textContent = docs[j] + ': ' + k;
      r.append(title);
      s.append(r);
    });
    const lab = (x, y, txt, anchor) => { const t = svg('text', { x: x, y: y, 'text-anchor': anchor }); t.textContent = txt; s.append(t); };
    lab(pad, 12, 'max ' + top, 'start');
    lab(pad, H - 4, '1', 'start');
    lab(W - pad, H - 4, String(n) + ' documents', 'end');
    return s;
  }

  // forms returns the spellings to mark in contexts, longest first.
  function forms(c, d) {
    const fs = [c.term].concat((d.variants || []).map(v => v.form));
    return Array.from(new Set(fs.filter(Boolean))).sort((a, b) => b.length - a.length);
  }
  function escapeRe(s) { return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'); }

  // A concordance line: the left context aligned to the right, the marked
  // term, the right context; its source below.
  function addLines(box, ctxs, fs) {
    const re = new RegExp('(^|[^\\p{L}\\p{N}])(' + fs.map(f => escapeRe(f).replace(/[ -]/g, '[\\s\\-]?')).join('|') + ')(?=$|[^\\p{L}\\p{N}])', 'iu');
    ctxs.forEach(cx => {
      const src = el('div', { class: 'src', text: (S.data.docs[cx.doc] || '?') + ':' + cx.line });
      const m = re.exec(cx.text);
      if (!m) { box.append(el('div', { class: 'gs-line whole' }, [el('span', { text: cx.text }), src])); return; }
      const at = m.index + m[1].length, end = at + m[2].length;
      box.append(el('div', { class: 'gs-line' }, [
        el('div', { class: 'l' }, [el('span', { text: cx.text.slice(0, at) })]),
        el('mark', { text: cx.text.slice(at, end) }),
        el('div', { class: 'r', text: cx.text.slice(end) }),
        src]));
    });
  }

  function moreContexts() {
    const i = S.sel, d = S.detail;
    if (!d || !(d.more > 0)) return;
    S.src.more(i, S.moreFrom).then(r => {
      if (S.sel !== i) return;
      addLines(document.getElementById('gs-kwic'), r.contexts, forms(S.data.cands[i], d));
      S.moreFrom += r.contexts.length;
      d.more = r.more;
      const b = document.getElementById('gs-more');
      if (b) { if (r.more > 0) b.textContent = 'more contexts (' + r.more + ') [c]'; else b.remove(); }
    }).catch(showError);
  }

  function collocates(d) {
    const cs = d.collocates || [];
    if (!cs.length) return el('div', { class: 'gs-empty', text: 'none found by the pair rules' });
    return el('ul', { class: 'gs-colls' }, cs.map(c => el('li', null, [
      document.createTextNode(c.word + ' '), el('span', { class: 'rel', text: c.rel.replace(/_/g, ' ') + ' · ' + c.freq + '× · logDice ' + fmt(c.logDice, 1) })])));
  }

  function links(ids) {
    if (!ids || !ids.length) return el('div', { class: 'gs-empty', text: 'none' });
    return el('ul', { class: 'gs-links' }, ids.map(j => el('li', null, [el('a', { text: S.data.cands[j].term, onclick: () => reveal(j) })])));
  }

  // reveal shows candidate j even when the filters hide it.
  function reveal(j) {
    let pos = S.view.indexOf(j);
    if (pos < 0) {
      S.filter = { text: '', status: '', pos: '', minFreq: 0 };
      syncFilters();
      applyView();
      pos = S.view.indexOf(j);
    }
    S.page = Math.floor(pos / S.pageSize);
    renderTable();
    select(j, true);
  }

  // ---- actions ----

  function act(a) {
    return S.src.act(a).then(applyChange).catch(showError);
  }

  function applyChange(ch) {
    Object.keys(ch.changed || {}).forEach(k => { S.decisions[+k] = ch.changed[k]; refreshRow(+k); });
    S.reviewed = ch.reviewed;
    renderCounter();
    if (S.sel >= 0 && ch.changed && ch.changed[S.sel] && S.detail) {
      S.detail.decision = S.decisions[S.sel];
      renderDetail();
    }
    return ch;
  }

  function decide(kind, advance) {
    return () => {
      if (S.sel < 0) return;
      act({ id: S.sel, kind: kind }).then(ch => { if (ch && advance) move(1); });
    };
  }

  function pickForm(kind, title) {
    return () => {
      if (S.sel < 0 || !S.detail) return;
      const vs = (S.detail.variants || []).map(v => ({ label: v.form + ' (' + v.count + ')', value: v.form }));
      if (!vs.length) vs.push({ label: S.data.cands[S.sel].term, value: S.data.cands[S.sel].term });
      ask({ title: title, choices: vs }).then(form => { if (form) act({ id: S.sel, kind: kind, form: form }); });
    };
  }

  function merge() {
    if (S.sel < 0) return;
    const me = S.sel;
    ask({ title: 'Merge “' + S.data.cands[me].term + '” with… (type to find a candidate)', search: true }).then(other => {
      if (other !== null && other !== undefined) act({ id: me, kind: 'merge', other: other });
    });
  }

  function editText(kind, title, field, multi) {
    return () => {
      if (S.sel < 0) return;
      ask({ title: title, value: S.decisions[S.sel][field] || '', multi: multi }).then(t => {
        if (t !== null && t !== undefined) act({ id: S.sel, kind: kind, text: t });
      });
    };
  }

  function undo() {
    S.src.undo().then(ch => { applyChange(ch); toast(ch.undone ? 'undone' : 'nothing to undo'); }).catch(showError);
  }

  function actions() {
    const live = S.src.live;
    const list = [
      { id: 'accept', key: 'y', button: 'Accept', cls: 'yes', help: 'accept the candidate as a term, go to the next', run: decide('accept', true) },
      { id: 'reject', key: 'n', button: 'Reject', cls: 'no', help: 'reject the candidate and go to the next', run: decide('reject', true) },
      { id: 'defer', key: 'w', button: 'Defer', help: 'defer: put the decision off (wait), go to the next', run: decide('defer', true) }
    ];
    if (live) {
      list.push(
        { id: 'prefer', key: 'f', button: 'Preferred form…', help: 'choose the preferred form among the variants', run: pickForm('prefer', 'Preferred form') },
        { id: 'admit', key: 'v', button: 'Admit variant…', help: 'mark a variant as admitted', run: pickForm('admit', 'Variant to admit') },
        { id: 'deprecate', key: 'b', button: 'Deprecate variant…', help: 'mark a variant as deprecated (barred)', run: pickForm('deprecate', 'Variant to deprecate') },
        { id: 'merge', key: 'g', button: 'Merge…', help: 'merge with another candidate into one concept (group)', run: merge },
        { id: 'definition', key: 'e', button: 'Definition', help: 'edit the definition', run: editText('definition', 'Definition', 'definition', true) },
        { id: 'note', key: 'o', button: 'Note', help: 'edit the note', run: editText('note', 'Note', 'note', true) },
        { id: 'pos', key: 's', button: 'POS', help: 'set the part of speech', run: editText('pos', 'Part of speech (e.g. noun, verb, adjective)', 'pos', false) });
    } else {
      list.push({ id: 'note', key: 'o', help: 'write a remark on the term', run: () => { const t = document.getElementById('gs-remark'); if (t) t.focus(); } });
    }
    list.push(
      { id: 'undo', key: 'z', button: 'Undo', help: 'undo: take back the latest change', run: undo },
      { id: 'down', key: '↓', help: 'next candidate', run: () => move(1) },
      { id: 'up', key: '↑', help: 'previous candidate', run: () => move(-1) },
      { id: 'next', key: ']', help: 'next page', run: () => turn(1) },
      { id: 'prev', key: '[', help: 'previous page', run: () => turn(-1) },
      { id: 'more', key: 'c', help: 'more contexts', run: moreContexts },
      { id: 'find', key: '/', help: 'filter the terms by text', run: () => document.getElementById('gs-q').focus() },
      { id: 'help', key: '?', help: 'this list of keys', run: help });
    return list;
  }

  function turn(step) {
    const pages = Math.max(1, Math.ceil(S.view.length / S.pageSize));
    const p = Math.min(pages - 1, Math.max(0, S.page + step));
    if (p !== S.page) { S.page = p; renderTable(); }
  }

  const keyName = { ArrowDown: '↓', ArrowUp: '↑' };
  // held is the key whose keydown ran an action, until that key comes up: a
  // dialog the action opened must not receive the key's character. The
  // character (keypress) follows the keydown as an event of its own, sooner
  // or later, so it is told apart by the key still being down, not by time.
  let held = null;
  document.addEventListener('keydown', e => { if (!e.repeat) held = null; }, true);
  document.addEventListener('keyup', e => { if (e.key === held) held = null; }, true);
  document.addEventListener('keypress', e => { if (e.key === held) e.preventDefault(); }, true);
  window.addEventListener('blur', () => { held = null; });
  function onKey(e) {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    const ov = document.getElementById('gs-overlay');
    if (!ov.hidden) return; // the dialog has the keys
    const t = e.target;
    if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT')) {
      if (e.key === 'Escape') t.blur();
      return;
    }
    const k = keyName[e.key] || e.key;
    const a = actions().find(x => x.key === k);
    if (a) { e.preventDefault(); held = e.key; a.run(); }
  }

  // ---- dialogs ----

  // ask shows a dialog: a text field (value, multi), a numbered list of
  // choices, or a search over the candidates; resolves to the answer or null.
  function ask(opt) {
    return new Promise(resolve => {
      const ov = document.getElementById('gs-overlay');
      const box = el('div', { class: 'gs-dialog', role: 'dialog', 'aria-modal': 'true' });
      const done = v => { ov.hidden = true; ov.replaceChildren(); document.removeEventListener('keydown', keys, true); resolve(v); };
      let field = null, list = null, items = [], on = 0;
      box.append(el('h2', { text: opt.title }));
      if (opt.choices || opt.search) {
        if (opt.search) {
          field = el('input', { type: 'search', id: 'gs-ask', placeholder: 'part of a term', autocomplete: 'off' });
          box.append(field);
        }
        list = el('ol', { id: 'gs-choices' });
        box.append(list);
        const fill = () => {
          if (opt.search) {
            const q = field.value.toLowerCase();
            items = [];
            for (let j = 0; j < S.data.cands.length && items.length < 9; j++) {
              const c = S.data.cands[j];
              if (j !== S.sel && (!q || c.term.toLowerCase().indexOf(q) >= 0)) items.push({ label: c.term + ' (' + c.freq + ')', value: j });
            }
          } else items = opt.choices;
          on = Math.min(on, Math.max(0, items.length - 1));
          list.replaceChildren(...items.map((it, j) => el('li', { class: j === on ? 'on' : '', text: it.label, onclick: () => done(it.value) })));
        };
        if (field) field.addEventListener('input', () => { on = 0; fill(); });
        fill();
        box.append(el('div', { class: 'gs-facts', text: 'digits 1–9 or ↑ ↓ and Enter choose; Esc cancels' }));
      } else {
        field = el(opt.multi ? 'textarea' : 'input', { id: 'gs-ask' });
        field.value = opt.value || '';
        box.append(field, el('div', { class: 'row' }, [
          el('button', { text: 'Cancel', onclick: () => done(null) }),
          el('button', { id: 'gs-ask-ok', text: 'Save (Ctrl+Enter)', onclick: () => done(field.value) })]));
      }
      function keys(e) {
        if (e.key === 'Escape') { e.preventDefault(); done(null); return; }
        if (list) {
          const digit = /^[1-9]$/.test(e.key) && (!field || document.activeElement !== field || e.altKey);
          if (digit || (/^[1-9]$/.test(e.key) && !opt.search)) {
            const it = items[+e.key - 1];
            if (it) { e.preventDefault(); done(it.value); }
            return;
          }
          if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
            e.preventDefault();
            on = Math.min(items.length - 1, Math.max(0, on + (e.key === 'ArrowDown' ? 1 : -1)));
            Array.from(list.children).forEach((li, j) => { li.className = j === on ? 'on' : ''; });
            return;
          }
          if (e.key === 'Enter' && items[on]) { e.preventDefault(); done(items[on].value); }
          return;
        }
        if (e.key === 'Enter' && (e.ctrlKey || !opt.multi)) { e.preventDefault(); done(field.value); }
      }
      document.addEventListener('keydown', keys, true);
      ov.replaceChildren(box);
      ov.hidden = false;
      if (field) field.focus();
      ov.onclick = e => { if (e.target === ov) done(null); };
    });
  }

  function help() {
    const ov = document.getElementById('gs-overlay');
    const rows = actions().map(a => el('tr', null, [el('td', null, [el('kbd', { text: a.key })]), el('td', { text: a.help })]));
    const box = el('div', { class: 'gs-dialog', id: 'gs-help', role: 'dialog' }, [
      el('h2', { text: 'Keys' }), el('table', { class: 'gs-keys' }, rows),
      el('div', { class: 'gs-facts', text: S.src.live ? 'Every decision is saved to the termbase at once.' : 'Remarks stay in this browser until you download them.' }),
      el('div', { class: 'row' }, [el('button', { text: 'Close (Esc)', onclick: close })])]);
    function close() { ov.hidden = true; ov.replaceChildren(); document.removeEventListener('keydown', esc, true); }
    function esc(e) { if (e.key === 'Escape' || e.key === '?') { e.preventDefault(); close(); } }
    document.addEventListener('keydown', esc, true);
    ov.replaceChildren(box);
    ov.hidden = false;
    ov.onclick = e => { if (e.target === ov) close(); };
  }

  let toastTimer = 0;
  function toast(msg, err) {
    const t = document.getElementById('gs-toast');
    t.textContent = msg;
    t.className = 'gs-toast' + (err ? ' err' : '');
    t.hidden = false;
    clearTimeout(toastTimer);
    toastTimer = setTimeout(() => { t.hidden = true; }, err ? 6000 : 1800);
  }
  function showError(e) { toast(String(e && e.message || e), true); }

  function download() {
    const blob = new Blob([S.src.csv()], { type: 'text/csv;charset=utf-8' });
    const a = el('a', { href: URL.createObjectURL(blob), download: 'remarks.csv' });
    document.body.append(a);
    a.click();
    setTimeout(() => { URL.revokeObjectURL(a.href); a.remove(); }, 0);
  }

  // ---- the page ----

  function syncFilters() {
    document.getElementById('gs-q').value = S.filter.text;
    document.getElementById('gs-status').value = S.filter.status;
    document.getElementById('gs-pos').value = S.filter.pos;
    document.getElementById('gs-minfreq').value = S.filter.minFreq || '';
  }

  function build() {
    const data = S.data;
    const posCount = {};
    data.cands.forEach(c => { posCount[c.pos] = (posCount[c.pos] || 0) + 1; });
    const posList = Object.keys(posCount).sort((a, b) => posCount[b] - posCount[a] || (a < b ? -1 : 1)).slice(0, 40);
    const on = (id, ev, fn) => document.getElementById(id).addEventListener(ev, fn);
    const top = el('header', { class: 'gs-top' }, [
      el('h1', null, [el('b', { text: 'glossmith' }), document.createTextNode(S.src.live ? ' · term review' : ' · term candidates for review')]),
      el('span', { class: 'gs-source', text: data.source || '' }),
      el('span', { class: 'gs-counter', id: 'gs-counter' }),
      S.src.live ? null : el('button', { id: 'gs-download', text: 'Download remarks (CSV)', onclick: download }),
      el('button', { id: 'gs-helpbtn', text: 'Keys ?', onclick: help })]);
    const filters = el('div', { class: 'gs-filters' }, [
      el('input', { type: 'search', id: 'gs-q', placeholder: 'filter terms  ( / )', autocomplete: 'off' }),
      el('select', { id: 'gs-status', title: 'status' }, [el('option', { value: '', text: 'any status' })].concat(statuses.map(s => el('option', { value: s, text: s })))),
      el('select', { id: 'gs-pos', title: 'part of speech' }, [el('option', { value: '', text: 'any POS' })].concat(posList.map(p => el('option', { value: p, text: p })))),
      el('label', { for: 'gs-minfreq', text: 'min freq' }),
      el('input', { type: 'number', id: 'gs-minfreq', min: 0 }),
      el('span', { class: 'gs-shown', id: 'gs-shown' })]);
    const head = el('tr', null, columns.map(c => el('th', { class: c.text ? 't' : '', 'data-key': c.key, text: c.label, title: 'sort by ' + c.label })));
    const table = el('table', { class: 'gs-table', id: 'gs-table' }, [el('thead', null, [head]), el('tbody', { id: 'gs-rows' })]);
    const pager = el('div', { class: 'gs-pager' }, [
      el('button', { id: 'gs-prev', text: '‹ prev [', onclick: () => turn(-1) }),
      el('span', { id: 'gs-page' }),
      el('button', { id: 'gs-next', text: '] next ›', onclick: () => turn(1) })]);
    const list = el('section', { class: 'gs-list' }, [filters, el('div', { class: 'gs-tablewrap' }, [table]), pager]);
    const detail = el('section', { class: 'gs-detail', id: 'gs-detail' }, [el('div', { class: 'gs-empty', text: 'Choose a candidate on the left (↓ ↑ move, ? lists the keys).' })]);
    const app = document.getElementById('app');
    app.className = '';
    app.replaceChildren(top, el('main', { class: 'gs-main' }, [list, detail]),
      el('div', { class: 'gs-overlay', id: 'gs-overlay', hidden: true }),
      el('div', { class: 'gs-toast', id: 'gs-toast', hidden: true, role: 'status' }));

    on('gs-q', 'input', e => { S.filter.text = e.target.value; S.page = 0; applyView(); });
    on('gs-status', 'change', e => { S.filter.status = e.target.value; S.page = 0; applyView(); });
    on('gs-pos', 'change', e => { S.filter.pos = e.target.value; S.page = 0; applyView(); });
    on('gs-minfreq', 'input', e => { S.filter.minFreq = +e.target.value || 0; S.page = 0; applyView(); });
    head.addEventListener('click', e => {
      const k = e.target.dataset && e.target.dataset.key;
      if (!k) return;
      if (S.sortKey === k) S.sortDir = -S.sortDir;
      else { S.sortKey = k; S.sortDir = (k === 'term' || k === 'rank' || k === 'status' || k === 'pos' || k === 'dp') ? 1 : -1; }
      applyView();
    });
    document.getElementById('gs-rows').addEventListener('click', e => {
      const tr = e.target.closest('tr');
      if (tr) select(+tr.dataset.id, false);
    });
    document.addEventListener('keydown', onKey);
  }

  function start() {
    setPending(0);
    const inline = document.getElementById('gs-data');
    if (inline) {
      S.src = reportSource(JSON.parse(inline.textContent));
    } else {
      const meta = document.querySelector('meta[name="gs-token"]');
      S.src = liveSource(meta ? meta.content : '');
    }
    S.src.load().then(data => {
      S.data = data;
      S.decisions = data.decisions;
      S.reviewed = S.decisions.filter(d => d.status && d.status !== 'new').length;
      build();
      renderCounter();
      applyView();
      // Ready once the first frame with the table is drawn; the time since
      // the navigation began is kept for the first-paint benchmark.
      requestAnimationFrame(() => setTimeout(() => {
        window.gsReadyAt = performance.now();
        document.body.dataset.ready = 'yes';
      }, 0));
    }).catch(e => {
      const app = document.getElementById('app');
      app.textContent = 'Could not load the candidates: ' + (e && e.message || e);
    });
  }

  start();
})();
