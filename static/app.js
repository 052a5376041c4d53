// gridloom page script.
//
// 1. Live what-if: any change to the live form (form[data-live]: the
//    planner's, or the comparison's) fetches its fragment (data-fragment)
//    with the same query and brings the figures, the tables and the
//    findings in line with it, touching only the nodes that changed. The
//    form itself is patched in place (messages, placeholders, choices) just
//    after the repaint, so what the user is typing is never touched; it is
//    replaced whole only after an edit of the partition list, or when the
//    set of fields changes.
// 2. History: the address always holds the plan, updated as soon as the
//    new plan is drawn. A burst of typing opens one history entry
//    (pushState) and keeps it current (replaceState); a committed change
//    opens its own. The back button walks back through edits (popstate).
// 3. The figure's readout: the pointer, or the arrow keys when the figure
//    has focus, name the partition, slot, symbol, symbol start and cyclic
//    prefix, CRB and frequency under it. They are computed here from the
//    figure's hover contract (#gl-plot: data-x, data-y, data-w, data-h,
//    data-span-tc, data-low-hz, data-high-hz) and the lattice parameters in
//    #gl-lattice, with the timing of TS 38.211 5.3.1 — never from one DOM
//    element per cell.
//
// 4. The walkthrough: the arrow keys, Page Up and Page Down, Home and End
//    move between steps without a reload; each step has its own address
//    and history entry, and the figure's highlight follows.
// 5. Opening a plan by dropping a plan file or a saved figure on the
//    planner: the file is posted to /open as the Open control would.
// 6. Copy links (a[data-copy]): the text the link points at goes to the
//    clipboard, and #gl-copied says so; without this script the link
//    opens the text.
//
// Without this script every page still works: the forms are plain GET
// forms, the edit buttons submit an op that the server applies, and the
// walkthrough's steps are links with the highlight marked by the server.
(() => {
  'use strict';

  const DEBOUNCE_MS = 250;
  const BUSY_AFTER_MS = 150;
  // EDITOR_MARK is where a fragment's form begins (after its results).
  const EDITOR_MARK = '<!--gl-editor-->';
  // PART_MARK comes before each part of the results (one element each).
  const PART_MARK = '<!--gl-part-->';

  // TS 38.211 4.1 and 5.3.1, in Tc = 1/(480 kHz · 4096).
  const KAPPA = 64;
  const TC_PER_SUBFRAME = 1966080;
  const TC_PER_HALF = TC_PER_SUBFRAME / 2;
  const TC_PER_US = 1966.08;

  const byId = (id) => document.getElementById(id);

  // ---------------------------------------------------------------------
  // Live update

  let timer = 0;
  let inflight = null; // AbortController of the fragment request in flight
  let seq = 0; // number of the latest request; older answers are dropped
  let typing = false; // the current burst of typing has its history entry
  let pendingTyping = false; // typed values wait for the pause before their update
  let swapping = false; // the form is being replaced: its events are not edits
  let moves = 0; // steps the user has taken in the history (popstate events)
  let shownParts = null; // the text of each part of the results shown, split at PART_MARK

  // liveForm is the form that the page keeps live, if it has one.
  const liveForm = () => document.querySelector('form[data-live]');

  // queryOf serialises the live form as the server reads it: empty values
  // are left out, except partition names (with their side's prefix on the
  // comparison), which keep a partition in place. op is the edit button
  // pressed: { name, value }.
  function queryOf(form, op) {
    const q = new URLSearchParams();
    for (const [k, v] of new FormData(form)) {
      if (typeof v !== 'string' || /^([ab]\.)?op$/.test(k)) continue;
      if (v === '' && !/^([ab]\.)?p\d+\.name$/.test(k)) continue;
      q.append(k, v);
    }
    if (op) q.set(op.name, op.value);
    return q.toString();
  }

  function schedule() {
    clearTimeout(timer);
    pendingTyping = true;
    timer = setTimeout(() => update({ commit: false }), DEBOUNCE_MS);
  }

  // update fetches the workspace for the form (or for query, when the
  // history gives one) and applies it.
  async function update({ commit, op = null, query = null, fromHistory = false }) {
    clearTimeout(timer);
    pendingTyping = false;
    const form = liveForm();
    if (!form) return;
    const q = query !== null ? query : queryOf(form, op);
    if (inflight) inflight.abort();
    const ctl = new AbortController();
    inflight = ctl;
    const mine = ++seq;
    stamp('sent');
    setBusy(true);
    let text;
    try {
      const res = await fetch(form.dataset.fragment + '?' + q, { signal: ctl.signal, headers: { Accept: 'text/html' } });
      if (res.status !== 200) {
        throw new Error('the server answered ' + res.status + ' ' + res.statusText);
      }
      stamp('answered');
      text = await res.text();
      stamp('read');
    } catch (err) {
      if (err.name === 'AbortError') return;
      if (mine === seq) {
        setBusy(false);
        trouble('The plan could not be updated (' + err.message + '). Your input is still in the form; press Update to try again.');
      }
      return;
    }
    if (mine !== seq) return;
    inflight = null;
    setBusy(false);
    // A template parses the fragment inert (no script runs, nothing loads)
    // and faster than DOMParser, which builds a whole document. The
    // fragment holds the results first and the form after EDITOR_MARK: the
    // results (the parts that changed, see showParts) are parsed and shown
    // at once, the form, unless it must be rebuilt now, after the next
    // frame, so that the new figure is painted without waiting for it.
    const cut = text.indexOf(EDITOR_MARK);
    const full = op !== null || fromHistory;
    const head = cut < 0 ? text : text.slice(0, cut);
    const parts = cut < 0 ? null : head.split(PART_MARK);
    let work = showParts(parts);
    if (!work) {
      work = parse(head).getElementById('gl-work');
      if (!work) {
        trouble('The server sent something that is not the planner; press Update to try again.');
        return;
      }
      stamp('parsed');
      showResults(work);
      shownParts = held(work) ? null : parts; // a held figure is compared again in full
    }
    trouble('');
    stamp('shown');
    const url = form.dataset.page + '?' + (work.dataset.query || '');
    if (full || cut < 0) {
      applyForm(cut < 0 ? work : parse(text.slice(cut)), { full, commit, keepOpen: !fromHistory });
      if (work.dataset.focus) focusControl(work.dataset.focus);
      if (!fromHistory) record(url, { commit });
      if (work.dataset.title) document.title = work.dataset.title;
      return;
    }
    // An edit of a value: the form's notes, the address and the title
    // follow the repaint (the browser takes its time over the last two).
    const moved = moves;
    afterPaint(() => {
      if (mine === seq) applyForm(parse(text.slice(cut)), { full: false, commit, keepOpen: true });
      if (moves !== moved) return; // the user has moved in the history meanwhile
      record(url, { commit });
      if (work.dataset.title) document.title = work.dataset.title;
    });
  }

  // afterPaint runs fn once the next frame is drawn, behind the tasks
  // already waiting then (the user's next keys among them).
  function afterPaint(fn) {
    requestAnimationFrame(() => setTimeout(() => setTimeout(fn, 0), 0));
  }

  // stamp leaves a performance mark (gl:sent, gl:answered, gl:read,
  // gl:parsed, gl:shown) for the profiler and the browser benchmark.
  // Only the latest of each is kept.
  function stamp(name) {
    if (!performance.mark) return;
    performance.clearMarks('gl:' + name);
    performance.mark('gl:' + name);
  }

  function parse(html) {
    const tpl = document.createElement('template');
    tpl.innerHTML = html;
    return tpl.content;
  }

  // record keeps the address in step with the plan: a burst of typing
  // opens one entry and keeps it current, a committed change opens its own.
  function record(url, { commit }) {
    const here = location.pathname + location.search;
    if (commit) {
      if (typing) history.replaceState(null, '', url);
      else if (url !== here) history.pushState(null, '', url);
      typing = false;
    } else if (!typing) {
      if (url !== here) history.pushState(null, '', url);
      typing = true;
    } else {
      history.replaceState(null, '', url);
    }
  }

  // setBusy greys the results while an answer is awaited, but only once it
  // is slow to come: a quick answer repaints without a flicker.
  let busyTimer = 0;
  function setBusy(on) {
    clearTimeout(busyTimer);
    const stale = (v) => {
      const r = byId('gl-results');
      if (r) r.classList.toggle('gl-stale', v);
    };
    if (on) busyTimer = setTimeout(() => stale(true), BUSY_AFTER_MS);
    else stale(false);
  }

  function trouble(msg) {
    const t = byId('gl-trouble');
    if (!t) return;
    t.textContent = msg;
    t.hidden = msg === '';
  }

  // showResults brings the figures, tables and findings in line with the
  // server's new rendering of them.
  // held says whether an answer's figure is to be held: while a value
  // does not parse, the server draws the plan without it, which moves point
  // A and the other partitions under the user's typing. The page keeps the
  // last figure (and its lattice, for the readout) until the value parses.
  const held = (work) => work.hasAttribute('data-unparsed');
  const figurePart = (el) => el.id === 'gl-lattice' || el.querySelector('#gl-figure') !== null;

  function markHeld(on) {
    const box = document.querySelector('.gl-figure-box');
    if (box) box.classList.toggle('gl-held', on);
  }

  function showResults(work) {
    const results = byId('gl-results');
    const fresh = work.querySelector('#gl-results');
    if (results && fresh) {
      if (held(work)) {
        for (const el of Array.from(fresh.children)) {
          const cur = figurePart(el) && (el.id ? byId(el.id) : results.querySelector('.gl-figure-box'));
          if (cur) el.replaceWith(cur.cloneNode(true));
        }
      }
      morph(results, fresh);
      markHeld(held(work));
      resetReadout();
    }
  }

  // showParts brings the results in line with parts, the text of the new
  // results split at PART_MARK, parsing only the parts whose text differs
  // from the one shown: a 40 KiB parse becomes one of the figure and a
  // table or two. It returns the fragment's workspace element (its data
  // without its content), or null when the parts do not line up with
  // those shown (the first update, a table come or gone, a fragment
  // without parts): the caller then parses all the results. The figure's part is always brought in line, since
  // the page script marks it up when it is pointed at.
  function showParts(parts) {
    const results = byId('gl-results');
    if (!parts || !shownParts || !results || parts.length < 2 || parts.length !== shownParts.length ||
        results.children.length !== parts.length - 1) return null;
    const work = parse(parts[0]).getElementById('gl-work');
    const fresh = work && work.querySelector('#gl-results');
    if (!fresh) return null;
    const changed = [];
    const hold = held(work);
    parts = parts.slice();
    for (let i = 1; i < parts.length; i++) {
      const cur = results.children[i - 1];
      if (hold && figurePart(cur)) {
        parts[i] = shownParts[i]; // still shown; compared again next time
        continue;
      }
      if (parts[i] === shownParts[i] && !cur.querySelector('#gl-figure')) continue;
      const f = parse(parts[i]).firstElementChild;
      if (!f) return null;
      changed.push([cur, f]);
    }
    stamp('parsed');
    syncAttrs(results, fresh);
    for (const [cur, f] of changed) {
      if (sameNode(cur, f)) morph(cur, f);
      else cur.replaceWith(document.adoptNode(f));
    }
    markHeld(hold);
    resetReadout();
    shownParts = parts;
    return work;
  }

  // applyForm brings the forms in line with the server's rendering (in
  // part, the nodes that follow EDITOR_MARK): patched in place, or
  // replaced whole after an edit of the partition list (full) or when the
  // set of fields changed.
  function applyForm(part, { full, commit, keepOpen }) {
    const upload = byId('gl-upload');
    const freshUpload = part.querySelector('#gl-upload');
    if (upload && freshUpload) {
      upload.setAttribute('action', freshUpload.getAttribute('action'));
      patchNotes(freshUpload);
    }
    const form = liveForm();
    const freshForm = form && part.querySelector('#' + form.id);
    if (!form || !freshForm) return;
    if (full || form.dataset.shape !== freshForm.dataset.shape) {
      replaceForm(form, freshForm, keepOpen);
    } else {
      patchForm(freshForm, commit);
    }
  }

  // morph brings the element cur in line with fresh, the server's new
  // rendering of it, and touches only what differs: the browser then
  // restyles, lays out and repaints the parts that changed, not the whole
  // figure and every table. Children are matched in order, by node type,
  // name and id; what does not match is moved in from fresh.
  function morph(cur, fresh) {
    syncAttrs(cur, fresh);
    let c = cur.firstChild;
    for (let f = fresh.firstChild; f; ) {
      const next = f.nextSibling;
      if (c && sameNode(c, f)) {
        if (c.nodeType !== Node.ELEMENT_NODE) {
          if (c.nodeValue !== f.nodeValue) c.nodeValue = f.nodeValue;
        } else if (!c.isEqualNode(f)) {
          morph(c, f);
        }
        c = c.nextSibling;
      } else {
        cur.insertBefore(document.adoptNode(f), c);
      }
      f = next;
    }
    while (c) {
      const next = c.nextSibling;
      c.remove();
      c = next;
    }
  }

  function sameNode(a, b) {
    if (a.nodeType !== b.nodeType || a.nodeName !== b.nodeName) return false;
    return a.nodeType !== Node.ELEMENT_NODE || (a.namespaceURI === b.namespaceURI && a.id === b.id);
  }

  function syncAttrs(cur, fresh) {
    for (const a of Array.from(cur.attributes)) {
      if (!fresh.hasAttributeNS(a.namespaceURI, a.localName)) cur.removeAttributeNS(a.namespaceURI, a.localName);
    }
    for (const a of fresh.attributes) {
      if (cur.getAttributeNS(a.namespaceURI, a.localName) !== a.value) cur.setAttributeNS(a.namespaceURI, a.name, a.value);
    }
  }

  function replaceForm(form, fresh, keepOpen) {
    const active = document.activeElement;
    const activeId = active && form.contains(active) ? active.id : '';
    const open = {};
    if (keepOpen) form.querySelectorAll('details[id]').forEach((d) => { open[d.id] = d.open; });
    // Removing a control that has focus and unsaved text fires its change
    // event; that is not an edit, so it must not open a history entry.
    swapping = true;
    try {
      form.replaceWith(document.adoptNode(fresh));
    } finally {
      swapping = false;
    }
    for (const [id, wasOpen] of Object.entries(open)) {
      const d = byId(id);
      if (d && wasOpen) d.open = true;
    }
    if (activeId) focusControl(activeId);
  }

  function optionsKey(sel) {
    return Array.from(sel.options, (o) => o.value + '\u0001' + o.text).join('\u0002');
  }

  function syncAttr(cur, fresh, name) {
    const v = fresh.getAttribute(name);
    if (v === null) cur.removeAttribute(name);
    else if (cur.getAttribute(name) !== v) cur.setAttribute(name, v);
  }

  // patchForm brings the live form in line with the server's rendering
  // without replacing a control: choices, placeholders and validity always;
  // values only on a committed change, and never the control being typed in.
  function patchForm(fresh, commit) {
    const active = document.activeElement;
    for (const el of fresh.querySelectorAll('input[id], select[id]')) {
      const cur = byId(el.id);
      if (!cur || cur.tagName !== el.tagName) continue;
      syncAttr(cur, el, 'aria-invalid');
      syncAttr(cur, el, 'placeholder');
      if (el.tagName === 'SELECT') {
        if (optionsKey(cur) !== optionsKey(el)) {
          cur.replaceChildren(...Array.from(el.options, (o) => document.adoptNode(o.cloneNode(true))));
          cur.value = el.value;
        } else if (commit && cur !== active) {
          cur.value = el.value;
        }
      } else if (el.type === 'checkbox') {
        if (commit && cur !== active) cur.checked = el.checked;
      } else if (commit && cur !== active && cur.value !== el.value) {
        cur.value = el.value;
      }
    }
    patchNotes(fresh);
    for (const el of fresh.querySelectorAll('[data-sync][id]')) {
      const cur = byId(el.id);
      if (cur && cur.textContent !== el.textContent) cur.textContent = el.textContent;
    }
    for (const b of fresh.querySelectorAll('button[id]')) {
      const cur = byId(b.id);
      if (cur) cur.disabled = b.disabled;
    }
    for (const d of fresh.querySelectorAll('details[id][open]')) {
      const cur = byId(d.id);
      if (cur && d.querySelector('.gl-error, .gl-warning')) cur.open = true;
    }
  }

  function patchNotes(fresh) {
    for (const n of fresh.querySelectorAll('[data-notes][id]')) {
      const cur = byId(n.id);
      if (cur && cur.innerHTML !== n.innerHTML) {
        cur.replaceChildren(...Array.from(n.childNodes, (c) => document.adoptNode(c.cloneNode(true))));
      }
    }
  }

  // focusControl focuses a control by id, or, when it is disabled (a move
  // button at the end of the list), the name of its partition.
  function focusControl(id) {
    let el = byId(id);
    if (el && el.disabled) {
      const m = /^((?:[ab]-)?)b-\w+-(\d+)$/.exec(id);
      el = m ? byId(m[1] + 'f-p' + m[2] + '-name') : null;
    }
    if (el) el.focus();
  }

  // Typing a locationAndBandwidth places the partition by it: the start
  // and size it replaces show as placeholders until the server fills them.
  function clearPlacement(riv) {
    const m = /^(?:([ab])\.)?p(\d+)\.riv$/.exec(riv.name);
    if (!m || riv.value.trim() === '') return;
    const prefix = m[1] ? m[1] + '-' : '';
    for (const k of ['start', 'size']) {
      const el = byId(prefix + 'f-p' + m[2] + '-' + k);
      if (el) el.value = '';
    }
  }

  function inPlanForm(t) {
    return !swapping && t && t.form && t.form.hasAttribute('data-live');
  }

  document.addEventListener('input', (e) => {
    const t = e.target;
    if (!inPlanForm(t) || t.tagName === 'SELECT' || t.type === 'checkbox') return;
    if (/^([ab]\.)?p\d+\.riv$/.test(t.name)) clearPlacement(t);
    schedule();
  });

  document.addEventListener('change', (e) => {
    if (inPlanForm(e.target)) update({ commit: true });
  });

  document.addEventListener('submit', (e) => {
    const form = e.target;
    if (!form || !form.hasAttribute('data-live')) return;
    e.preventDefault();
    const b = e.submitter;
    const op = b && /^([ab]\.)?op$/.test(b.name) ? { name: b.name, value: b.value } : null;
    if (op) {
      // Values typed just before a button (Add partition…) are a step of
      // their own, so that Back returns to them and not to the state before
      // the typing (issue 19): give them an entry now if the pause that
      // would have given it has not come, and let the edit open the next.
      if (pendingTyping) {
        const url = form.dataset.page + '?' + queryOf(form);
        if (url !== location.pathname + location.search) history.pushState(null, '', url);
      }
      typing = false;
    }
    update({ commit: true, op });
  });

  window.addEventListener('popstate', () => {
    moves++;
    if (byId('gl-walk')) return; // the walkthrough keeps its own history
    typing = false;
    if (location.search.length <= 1) {
      location.reload();
      return;
    }
    update({ commit: true, query: location.search.slice(1), fromHistory: true });
  });

  // ---------------------------------------------------------------------
  // Timing of TS 38.211 5.3.1

  // numerology holds, in Tc, the symbol parts of a partition's numerology:
  // N_u = 2048·κ·2^−μ; with normal CP N_CP = 144·κ·2^−μ, and 16·κ more at
  // l = 0 and l = 7·2^μ of each subframe; with extended CP (60 kHz only)
  // N_CP = 512·κ·2^−μ.
  function numerology(p) {
    const scale = 2 ** p.mu;
    const nu = (2048 * KAPPA) / scale;
    const cp = (p.extended ? 512 * KAPPA : 144 * KAPPA) / scale;
    const perSlot = p.extended ? 12 : 14;
    return {
      nu, cp, ext: p.extended, perSlot,
      longCp: p.extended ? cp : cp + 16 * KAPPA,
      perSubframe: perSlot * scale,
      half: 7 * scale, // symbols per half subframe, normal CP
    };
  }

  // symbolAt returns symbol k counted from the start of the span: the sum of
  // N_u + N_CP,l over the symbols before it, in closed form per half subframe.
  function symbolAt(n, k) {
    const sf = Math.floor(k / n.perSubframe);
    const l = k % n.perSubframe;
    let start = sf * TC_PER_SUBFRAME;
    let cp = n.cp;
    if (n.ext) {
      start += l * (n.nu + n.cp);
    } else {
      const h = Math.floor(l / n.half);
      const j = l % n.half;
      start += h * TC_PER_HALF;
      if (j > 0) start += 16 * KAPPA + j * (n.nu + n.cp);
      else cp = n.longCp;
    }
    return { k, slot: Math.floor(k / n.perSlot), symbol: k % n.perSlot, start, cp, length: n.nu + cp };
  }

  // symbolIndexAt is the symbol that holds instant t (Tc from the span start).
  function symbolIndexAt(n, t) {
    const sf = Math.floor(t / TC_PER_SUBFRAME);
    const r = t - sf * TC_PER_SUBFRAME;
    let l;
    if (n.ext) {
      l = Math.min(Math.floor(r / (n.nu + n.cp)), n.perSubframe - 1);
    } else {
      const h = Math.min(Math.floor(r / TC_PER_HALF), 1);
      const rr = r - h * TC_PER_HALF;
      const first = n.nu + n.longCp;
      const j = rr < first ? 0 : Math.min(n.half - 1, 1 + Math.floor((rr - first) / (n.nu + n.cp)));
      l = h * n.half + j;
    }
    return sf * n.perSubframe + l;
  }

  // crbEdge is the lower edge of CRB c: subcarrier 0 of CRB 0 is centred on
  // point A (TS 38.211 4.4.4.3), so the edge is c·12·SCS − SCS/2, in Hz.
  function crbEdge(p, c) {
    return c * 12 * p.scsHz - p.scsHz / 2;
  }

  // ---------------------------------------------------------------------
  // The figure's readout

  let fig = null; // the figure's geometry and lattice, for the current results
  let cursor = null; // the cell the keyboard points at: { part, k, crb }
  let pending = null; // the last pointer event, drawn on the next frame

  function resetReadout() {
    fig = null;
    cursor = null;
  }

  function figure() {
    if (fig && fig.plot.isConnected) return fig;
    const box = byId('gl-figure');
    const plot = box && box.querySelector('#gl-plot');
    const data = byId('gl-lattice');
    if (!plot || !data) return null;
    let lattice;
    try {
      lattice = JSON.parse(data.textContent);
    } catch {
      return null;
    }
    const num = (name) => Number(plot.getAttribute(name));
    fig = {
      box, plot, lattice,
      x: num('data-x'), y: num('data-y'), w: num('data-w'), h: num('data-h'),
      spanTc: num('data-span-tc'), lowHz: num('data-low-hz'), highHz: num('data-high-hz'),
      nums: lattice.parts.map(numerology),
      mark: null,
      raster: rasterOf(box), coreset: coresetOf(box),
    };
    if (!(fig.w > 0 && fig.h > 0 && fig.spanTc > 0 && fig.highHz > fig.lowHz)) {
      fig = null;
    }
    return fig;
  }

  // The raster's and CORESET#0's data attributes (render's package comment
  // names them), read once per figure for the readout.
  const nums = (el, name) => (el.getAttribute(name) || '').split(' ').filter((s) => s !== '').map(Number);
  function rasterOf(box) {
    const g = box.querySelector('.gl-raster');
    if (!g) return null;
    return {
      band: g.getAttribute('data-band') || '', scsKHz: g.getAttribute('data-scs-khz'),
      gscn: nums(g, 'data-gscn'), refHz: nums(g, 'data-ss-ref-hz'), fits: g.getAttribute('data-fits') || '',
      block: g.getAttribute('data-block-gscn'),
    };
  }
  function coresetOf(box) {
    const g = box.querySelector('.gl-coreset0');
    if (!g) return null;
    const n = (name) => Number(g.getAttribute(name));
    return {
      lowHz: n('data-low-hz'), highHz: n('data-high-hz'), startCrb: n('data-start-crb'), nrb: n('data-nrb'),
      symbols: n('data-symbols'), scsKHz: n('data-scs-khz'),
      ssb: nums(g, 'data-occ-ssb'), start: nums(g, 'data-occ-start-tc'), end: nums(g, 'data-occ-end-tc'),
    };
  }

  // rasterAt reads the raster strip left of the plot: the GSCN nearest the
  // pointer, within three pixels, or null.
  function rasterAt(f, clientX, clientY) {
    const r = f.raster;
    const m = f.plot.getScreenCTM();
    if (!r || !m || r.gscn.length === 0) return null;
    const p = new DOMPoint(clientX, clientY).matrixTransform(m.inverse());
    if (p.x >= f.x || p.x < f.x - 14 || p.y < f.y || p.y > f.y + f.h) return null;
    const hz = f.lowHz + ((f.y + f.h - p.y) / f.h) * (f.highHz - f.lowHz);
    let best = -1;
    r.refHz.forEach((ref, i) => { if (best < 0 || Math.abs(ref - hz) < Math.abs(r.refHz[best] - hz)) best = i; });
    const px = (Math.abs(r.refHz[best] - hz) / (f.highHz - f.lowHz)) * f.h;
    return px <= 3 ? best : null;
  }

  function showRaster(f, i) {
    const out = byId('gl-readout');
    const r = f.raster;
    const ref = r.refHz[i];
    const abs = f.lattice.pointAHz !== null ? ' (' + fmtMHz(f.lattice.pointAHz + ref) + ' MHz)' : '';
    const bits = [
      'GSCN ' + r.gscn[i] + (r.band ? ' of band ' + r.band : ''),
      'SS_REF ' + fmtKHz(ref) + ' kHz from point A' + abs,
      r.fits[i] === '1' ? 'a ' + r.scsKHz + ' kHz block centred here fits' : 'a ' + r.scsKHz + ' kHz block centred here would not fit',
    ];
    if (String(r.gscn[i]) === r.block) bits.push("the plan's SS/PBCH block is here");
    out.textContent = bits.join(' · ');
    setData(out, {});
    out.dataset.gscn = String(r.gscn[i]);
    mark(f, null);
  }

  // toPlot maps a pointer position to time (Tc) and frequency (Hz from
  // point A), or null outside the plot area.
  function toPlot(f, clientX, clientY) {
    const m = f.plot.getScreenCTM();
    if (!m) return null;
    const p = new DOMPoint(clientX, clientY).matrixTransform(m.inverse());
    if (p.x < f.x || p.x > f.x + f.w || p.y < f.y || p.y > f.y + f.h) return null;
    return {
      t: ((p.x - f.x) / f.w) * f.spanTc,
      hz: f.lowHz + ((f.y + f.h - p.y) / f.h) * (f.highHz - f.lowHz),
    };
  }

  // cellAt finds the partition, symbol and CRB at (t, hz).
  function cellAt(f, t, hz) {
    const parts = f.lattice.parts;
    const hits = [];
    parts.forEach((p, i) => { if (hz >= p.lowHz && hz < p.highHz) hits.push(i); });
    if (hits.length === 0) return { t, hz, part: -1 };
    const i = hits[0];
    const p = parts[i];
    const n = f.nums[i];
    const k = Math.min(symbolIndexAt(n, Math.max(0, Math.min(t, f.spanTc - 1))), p.symbols - 1);
    const crb = Math.min(Math.max(Math.floor((hz + p.scsHz / 2) / (12 * p.scsHz)), p.startCrb), p.startCrb + p.sizePrb - 1);
    return { t, hz, part: i, k, crb, also: hits.slice(1) };
  }

  const fmtUs = (tc) => (tc / TC_PER_US).toFixed(3);

  // --- Time unit of the readout (issue 19, paper and rooms) ---
  // fmtT writes a time in the figure's own time-axis unit, which gl-plot
  // publishes as data-time-unit ("us" or "ms"; render.TimeUnit), so the
  // readout and every tick of one figure use one unit. Both keep the
  // nanosecond: 3 decimals of µs, 6 of ms.
  const fmtT = (f, tc) => (f.plot.getAttribute('data-time-unit') === 'ms'
    ? (tc / (1000 * TC_PER_US)).toFixed(6) + ' ms'
    : fmtUs(tc) + ' µs');
  // --- end time unit ---
  const fmtKHz = (hz) => (hz / 1000).toFixed(1);
  const fmtMHz = (hz) => (hz / 1e6).toFixed(4);
  const DIRS = { D: 'downlink', U: 'uplink', F: 'flexible' };

  function show(f, cell) {
    const out = byId('gl-readout');
    if (!out) return;
    const parts = f.lattice.parts;
    f.plot.querySelectorAll('.gl-part.gl-hot').forEach((g) => g.classList.remove('gl-hot'));
    f.plot.classList.toggle('gl-hovering', cell.part >= 0);
    const abs = (hz) => (f.lattice.pointAHz !== null ? ' (' + fmtMHz(f.lattice.pointAHz + hz) + ' MHz)' : '');
    if (cell.part < 0) {
      out.textContent = 'No partition at ' + fmtKHz(cell.hz) + ' kHz from point A' + abs(cell.hz) + ', ' + fmtT(f, cell.t) + ' into the span.';
      setData(out, {});
      mark(f, null);
      return;
    }
    const p = parts[cell.part];
    const n = f.nums[cell.part];
    const s = symbolAt(n, cell.k);
    const g = f.plot.querySelector('.gl-part[data-index="' + cell.part + '"]');
    if (g) g.classList.add('gl-hot');
    const bits = [
      p.name + ' · ' + p.scsHz / 1000 + ' kHz' + (p.extended ? ' extended CP' : ''),
      'slot ' + s.slot + ', symbol ' + s.symbol,
      'starts ' + fmtT(f, s.start) + ', CP ' + fmtT(f, s.cp),
      'CRB ' + cell.crb + ' (PRB ' + (cell.crb - p.startCrb) + ')',
      fmtKHz(cell.hz) + ' kHz from point A' + abs(cell.hz),
    ];
    if (p.dirs) bits.push(DIRS[p.dirs[cell.k]] || p.dirs[cell.k]);
    const ssb = (f.lattice.ssb || []).find((b) => cell.t >= b.startTc && cell.t < b.endTc && cell.hz >= b.lowHz && cell.hz < b.highHz);
    if (ssb) bits.push('SS/PBCH block ' + ssb.index);
    const c = f.coreset;
    if (c && cell.hz >= c.lowHz && cell.hz < c.highHz) {
      const j = c.start.findIndex((s, i) => cell.t >= s && cell.t < c.end[i]);
      if (j >= 0) {
        const same = c.ssb.filter((_, i) => c.start[i] === c.start[j]);
        bits.push('CORESET#0 occasion for SSB ' + same.join(', ') + ': CRBs ' + c.startCrb + '–' + (c.startCrb + c.nrb - 1) + ' of ' + c.scsKHz + ' kHz, ' + c.symbols + ' symbols from ' + fmtT(f, c.start[j]));
      }
    }
    const ro = prachAt(f, cell.t, cell.hz);
    if (ro) bits.push(ro);
    if (cell.also && cell.also.length) bits.push('overlaps ' + cell.also.map((i) => parts[i].name).join(', '));
    out.textContent = bits.join(' · ');
    setData(out, {
      part: String(p.plan), name: p.name, slot: String(s.slot), symbol: String(s.symbol), k: String(s.k),
      startTc: String(s.start), cpTc: String(s.cp), crb: String(cell.crb),
    });
    mark(f, { p, s, crb: cell.crb });
  }

  // prachAt names the PRACH occasion under the pointer, from the figure's
  // gl-prach group (render/prach.go: data-occ-* lists, one entry per
  // occasion), or '' when there is none.
  function prachAt(f, t, hz) {
    if (f.prach === undefined) {
      const g = f.plot.querySelector('.gl-prach');
      f.prach = null;
      if (g) {
        const list = (k) => (g.dataset[k] || '').split(' ').filter((x) => x !== '');
        f.prach = {
          index: g.dataset.index, format: g.dataset.format, start: list('occStartTc').map(Number), end: list('occEndTc').map(Number),
          low: list('occLowHz').map(Number), high: list('occHighHz').map(Number), valid: list('occValid'), ssb: list('occSsb'),
        };
      }
    }
    const p = f.prach;
    if (!p) return '';
    for (let i = 0; i < p.start.length; i++) {
      if (t >= p.start[i] && t < p.end[i] && hz >= p.low[i] && hz < p.high[i]) {
        return 'PRACH occasion (index ' + p.index + ', ' + p.format + ')' + (p.valid[i] === '1' ? ' valid' : ' not valid') +
          (p.ssb[i] && p.ssb[i] !== '-' ? ', SSB ' + p.ssb[i] : '');
      }
    }
    return '';
  }

  function setData(el, d) {
    delete el.dataset.gscn;
    for (const k of ['part', 'name', 'slot', 'symbol', 'k', 'startTc', 'cpTc', 'crb']) {
      if (k in d) el.dataset[k] = d[k];
      else delete el.dataset[k];
    }
  }

  // mark outlines the cell (one symbol by one CRB) in the figure.
  function mark(f, cell) {
    if (!cell) {
      if (f.mark) f.mark.remove();
      f.mark = null;
      return;
    }
    if (!f.mark) {
      f.mark = document.createElementNS('http://www.w3.org/2000/svg', 'rect');
      f.mark.setAttribute('class', 'gl-cursor');
      f.plot.appendChild(f.mark);
    }
    const { p, s, crb } = cell;
    const x0 = f.x + (s.start / f.spanTc) * f.w;
    const x1 = f.x + ((s.start + s.length) / f.spanTc) * f.w;
    const yOf = (hz) => f.y + f.h - ((hz - f.lowHz) / (f.highHz - f.lowHz)) * f.h;
    const top = yOf(crbEdge(p, crb + 1));
    const bottom = yOf(crbEdge(p, crb));
    f.mark.setAttribute('x', String(x0));
    f.mark.setAttribute('y', String(top));
    f.mark.setAttribute('width', String(Math.max(x1 - x0, 1)));
    f.mark.setAttribute('height', String(Math.max(bottom - top, 1)));
  }

  function hide() {
    const f = figure();
    if (!f) return;
    f.plot.classList.remove('gl-hovering');
    f.plot.querySelectorAll('.gl-part.gl-hot').forEach((g) => g.classList.remove('gl-hot'));
    mark(f, null);
    dockReadout();
  }

  document.addEventListener('pointermove', (e) => {
    if (!e.target.closest || !e.target.closest('#gl-figure')) return;
    if (pending === null) requestAnimationFrame(drawPending);
    pending = { x: e.clientX, y: e.clientY };
  });

  function drawPending() {
    const at = pending;
    pending = null;
    const f = figure();
    if (!f || !at) return;
    const p = toPlot(f, at.x, at.y);
    if (!p) {
      const i = rasterAt(f, at.x, at.y);
      if (i !== null) {
        liftReadout();
        showRaster(f, i);
        floatReadout(at.x, at.y);
      }
      return;
    }
    liftReadout();
    show(f, cellAt(f, p.t, p.hz));
    floatReadout(at.x, at.y);
  }

  document.addEventListener('pointerout', (e) => {
    if (e.target.closest && e.target.closest('#gl-figure') && !(e.relatedTarget && e.relatedTarget.closest && e.relatedTarget.closest('#gl-figure'))) {
      if (document.activeElement && document.activeElement.id === 'gl-figure' && cursor) showCursor();
      else hide();
    }
  });

  // Keyboard: arrows move by symbol and CRB (with Shift by slot and ten
  // CRBs), Page Up and Page Down change partition, Home and End jump to
  // the span's ends, Escape hides the mark.
  function showCursor() {
    const f = figure();
    if (!f || !cursor) return;
    const p = f.lattice.parts[cursor.part];
    const s = symbolAt(f.nums[cursor.part], cursor.k);
    liftReadout();
    show(f, { part: cursor.part, k: cursor.k, crb: cursor.crb, t: s.start + s.length / 2, hz: crbEdge(p, cursor.crb) + 6 * p.scsHz });
    if (f.mark) {
      const r = f.mark.getBoundingClientRect();
      floatReadout(r.right, r.bottom);
    }
  }

  // byFrequency lists the partition indexes from the lowest up.
  function byFrequency(f) {
    return f.lattice.parts.map((_, i) => i).sort((a, b) => f.lattice.parts[a].lowHz - f.lattice.parts[b].lowHz);
  }

  document.addEventListener('focusin', (e) => {
    if (e.target.id !== 'gl-figure') return;
    const f = figure();
    if (!f || f.lattice.parts.length === 0) return;
    if (!cursor) {
      const i = byFrequency(f)[0];
      cursor = { part: i, k: 0, crb: f.lattice.parts[i].startCrb };
    }
    showCursor();
  });

  document.addEventListener('focusout', (e) => {
    if (e.target.id === 'gl-figure') hide();
  });

  document.addEventListener('keydown', (e) => {
    if (e.target.id !== 'gl-figure' || e.altKey || e.ctrlKey || e.metaKey) return;
    const f = figure();
    if (!f || !cursor) return;
    const p = f.lattice.parts[cursor.part];
    const n = f.nums[cursor.part];
    const clampK = (k) => Math.max(0, Math.min(k, p.symbols - 1));
    const clampC = (c) => Math.max(p.startCrb, Math.min(c, p.startCrb + p.sizePrb - 1));
    const step = e.shiftKey ? n.perSlot : 1;
    switch (e.key) {
      case 'ArrowRight': cursor.k = clampK(cursor.k + step); break;
      case 'ArrowLeft': cursor.k = clampK(cursor.k - step); break;
      case 'ArrowUp': cursor.crb = clampC(cursor.crb + (e.shiftKey ? 10 : 1)); break;
      case 'ArrowDown': cursor.crb = clampC(cursor.crb - (e.shiftKey ? 10 : 1)); break;
      case 'Home': cursor.k = 0; break;
      case 'End': cursor.k = p.symbols - 1; break;
      case 'PageUp':
      case 'PageDown': {
        const order = byFrequency(f);
        const at = order.indexOf(cursor.part) + (e.key === 'PageUp' ? 1 : -1);
        if (at < 0 || at >= order.length) break;
        const s = symbolAt(n, cursor.k);
        const j = order[at];
        const q = f.lattice.parts[j];
        const t = s.start + s.length / 2;
        cursor = {
          part: j,
          k: Math.min(symbolIndexAt(f.nums[j], t), q.symbols - 1),
          crb: e.key === 'PageUp' ? q.startCrb : q.startCrb + q.sizePrb - 1,
        };
        break;
      }
      case 'Escape': hide(); return;
      default: return;
    }
    e.preventDefault();
    showCursor();
  });

  // A link to a closed <details> (the figure's options) opens it.
  document.addEventListener('click', (e) => {
    const a = e.target.closest && e.target.closest('a[href^="#"]');
    const d = a && byId(a.getAttribute('href').slice(1));
    if (d && d.tagName === 'DETAILS') d.open = true;
  });

  // ---------------------------------------------------------------------
  // The walkthrough

  // The server renders every step, the current one shown, the others
  // hidden; each step's section carries the figure's highlight classes
  // (data-hl, built by the server from its own targets) and the table of
  // contents holds each step's link.
  const walk = {
    root: () => byId('gl-walk'),
    steps: () => Array.from(document.querySelectorAll('#gl-walk-text .gl-step')),
    links: () => Array.from(document.querySelectorAll('.gl-walk-toc a[data-step]')),
    current: () => Number(byId('gl-walk').dataset.current),
  };

  // showStep shows step i: its text, the figure's highlight, the counter,
  // the neighbours' links and the address.
  function showStep(i, { push = true } = {}) {
    const root = walk.root();
    const steps = walk.steps();
    const links = walk.links();
    if (!root || i < 0 || i >= steps.length || !links[i]) return;
    steps.forEach((s, k) => { s.hidden = k !== i; });
    const fig = byId('gl-walk-figure');
    if (fig) fig.className = ('gl-walk-figure ' + (steps[i].dataset.hl || '')).trim();
    links.forEach((a, k) => {
      if (k === i) a.setAttribute('aria-current', 'step');
      else a.removeAttribute('aria-current');
    });
    const count = byId('gl-walk-count');
    if (count) count.textContent = 'Step ' + (i + 1) + ' of ' + steps.length;
    setLink(byId('gl-walk-prev'), i > 0 ? links[i - 1].getAttribute('href') : null);
    setLink(byId('gl-walk-next'), i + 1 < links.length ? links[i + 1].getAttribute('href') : null);
    const layout = document.querySelector('[data-layout]');
    if (layout) {
      const u = new URL(layout.href, location.href);
      u.searchParams.set('step', new URL(links[i].href, location.href).searchParams.get('step'));
      layout.href = u.pathname + u.search;
    }
    root.dataset.current = String(i);
    document.title = (i + 1) + '/' + steps.length + ' ' + steps[i].dataset.title + (root.dataset.titleTail || '');
    if (push) {
      const url = links[i].getAttribute('href');
      if (url !== location.pathname + location.search) history.pushState({ step: i }, '', url);
    }
  }

  function setLink(a, href) {
    if (!a) return;
    if (href) {
      a.setAttribute('href', href);
      a.removeAttribute('aria-disabled');
    } else {
      a.removeAttribute('href');
      a.setAttribute('aria-disabled', 'true');
    }
  }

  // stepOfAddress finds the step whose link the address holds.
  function stepOfAddress() {
    const here = new URL(location.href).searchParams.get('step');
    const links = walk.links();
    const i = links.findIndex((a) => new URL(a.href, location.href).searchParams.get('step') === here);
    return i < 0 ? 0 : i;
  }

  document.addEventListener('keydown', (e) => {
    if (!walk.root() || !byId('gl-walk-text') || e.altKey || e.ctrlKey || e.metaKey) return;
    const t = e.target;
    if (t && (t.isContentEditable || /^(INPUT|SELECT|TEXTAREA|BUTTON)$/.test(t.tagName))) return;
    const i = walk.current();
    const last = walk.steps().length - 1;
    let to;
    switch (e.key) {
      case 'ArrowRight': case 'PageDown': to = Math.min(i + 1, last); break;
      case 'ArrowLeft': case 'PageUp': to = Math.max(i - 1, 0); break;
      case 'Home': to = 0; break;
      case 'End': to = last; break;
      default: return;
    }
    e.preventDefault();
    if (to !== i) showStep(to);
  });

  document.addEventListener('click', (e) => {
    if (!byId('gl-walk-text') || e.button !== 0 || e.altKey || e.ctrlKey || e.metaKey || e.shiftKey) return;
    const a = e.target.closest && e.target.closest('#gl-walk-prev[href], #gl-walk-next[href], .gl-walk-toc a[data-step]');
    if (!a) return;
    e.preventDefault();
    const i = a.dataset.step !== undefined ? Number(a.dataset.step) : walk.current() + (a.id === 'gl-walk-next' ? 1 : -1);
    showStep(i);
  });

  window.addEventListener('popstate', () => {
    if (byId('gl-walk-text')) showStep(stepOfAddress(), { push: false });
  });

  // The print layout's button.
  document.querySelectorAll('[data-print]').forEach((b) => { b.hidden = false; });
  document.addEventListener('click', (e) => {
    if (e.target.closest && e.target.closest('[data-print]')) window.print();
  });

  // ---------------------------------------------------------------------
  // Opening a plan by dropping it on the planner

  function hasFiles(e) {
    return e.dataTransfer && Array.from(e.dataTransfer.types || []).includes('Files');
  }

  document.addEventListener('dragover', (e) => {
    if (!byId('gl-upload') || !hasFiles(e)) return;
    e.preventDefault();
    e.dataTransfer.dropEffect = 'copy';
    document.body.classList.add('gl-dropping');
  });

  document.addEventListener('dragleave', (e) => {
    if (e.relatedTarget === null) document.body.classList.remove('gl-dropping');
  });

  document.addEventListener('drop', (e) => {
    const upload = byId('gl-upload');
    if (!upload || !hasFiles(e)) return;
    e.preventDefault();
    document.body.classList.remove('gl-dropping');
    const file = e.dataTransfer.files[0];
    if (file) openFile(upload, file);
  });

  // postFile posts a dropped file to an Open form's action, as its button
  // would, and opens the plan the server redirects to; on a refusal it
  // returns the page the server answered, parsed, for the caller to show
  // the reason beside its file control (undefined when nothing came back).
  async function postFile(form, file) {
    const body = new FormData();
    body.append('plan', file, file.name);
    setBusy(true);
    let res;
    try {
      res = await fetch(form.getAttribute('action'), { method: 'POST', body });
    } catch (err) {
      setBusy(false);
      trouble('The file could not be sent (' + err.message + '); try the Open control.');
      return undefined;
    }
    if (res.ok && res.redirected) {
      location.assign(res.url);
      return undefined;
    }
    setBusy(false);
    return { status: res.status, page: new DOMParser().parseFromString(await res.text(), 'text/html') };
  }

  // openFile posts a file to the upload form's action, as the Open button
  // would, and opens the plan; on a refusal it shows the server's reason
  // beside the file control.
  async function openFile(upload, file) {
    const refused = await postFile(upload, file);
    if (!refused) return;
    const fresh = refused.page.getElementById('gl-upload');
    if (fresh) {
      patchNotes(fresh);
      const f = byId('f-file');
      if (f) f.focus();
    } else {
      trouble('The server could not open ' + file.name + ' (' + refused.status + ').');
    }
  }

  // A page answered for a refused Open (the button, a whole page) names the
  // control whose reason it shows: focus it, which scrolls it into view, as
  // a refused drop does, rather than leaving the reason far below the top.
  {
    const work = byId('gl-work');
    if (work && work.dataset.focus) {
      focusControl(work.dataset.focus);
      const reason = byId('n-' + work.dataset.focus);
      if (reason) reason.scrollIntoView({ block: 'nearest' });
    }
  }

  // ---------------------------------------------------------------------
  // Copy links

  document.addEventListener('click', (e) => {
    const a = e.target.closest && e.target.closest('a[data-copy]');
    if (!a || e.button !== 0 || e.ctrlKey || e.metaKey || e.shiftKey || e.altKey) return;
    e.preventDefault();
    copyFrom(a);
  });

  // copyFrom fetches the text a copy link points at (the address it shows
  // now: the live update keeps it current) and puts it on the clipboard;
  // a refusal (a plan with errors) is shown as the server's sentence.
  async function copyFrom(a) {
    const said = byId('gl-copied');
    const say = (msg) => { if (said) said.textContent = msg; };
    say('');
    let res, text;
    try {
      res = await fetch(a.href);
      text = await res.text();
    } catch (err) {
      trouble('The text could not be fetched (' + err.message + '); follow the link instead.');
      return;
    }
    if (!res.ok) {
      say(text.trim());
      return;
    }
    try {
      await navigator.clipboard.writeText(text);
    } catch (err) {
      if (!copyBySelection(text)) {
        say('The browser did not allow copying (' + err.message + '); open the link and copy the text from there.');
        return;
      }
    }
    const lines = text.split('\n').length - 1;
    say('Copied the plan ' + a.textContent.replace(/^Copy /, '') + ': ' + lines + ' lines.');
  }

  // copyBySelection is the older way to copy, for a page the Clipboard API
  // refuses (served over plain HTTP to another machine).
  function copyBySelection(text) {
    const box = document.createElement('textarea');
    box.value = text;
    box.setAttribute('readonly', '');
    box.style.position = 'fixed';
    box.style.opacity = '0';
    document.body.append(box);
    box.select();
    let ok = false;
    try {
      ok = document.execCommand('copy');
    } catch (err) {
      ok = false;
    }
    box.remove();
    return ok;
  }

  // ---------------------------------------------------------------------
  // --- The readout beside the pointer (issue 19) ---
  //
  // The readout sat under the figure, 300–450 px below the pointer. While
  // the pointer (or the keyboard's mark) is on the figure it floats beside
  // it, below and right of it, flipped to the other side where the
  // viewport ends, never covering the cell read; its place under the
  // figure is held, so that nothing below moves. It docks again when the
  // pointer leaves the figure. pointer-events: none lets the pointer reach
  // the figure under it.

  const READOUT_GAP = 14; // px between the pointer and the readout
  const VIEW_MARGIN = 6; // px kept free at the viewport's edges

  // liftReadout takes the readout out of the page's flow, holding its
  // place at the height it has docked; call it before the text changes.
  function liftReadout() {
    const out = byId('gl-readout');
    if (out && !out.classList.contains('gl-float')) {
      const cap = out.parentElement;
      if (cap) cap.style.minHeight = cap.getBoundingClientRect().height + 'px';
      // The figure's box paints on its own (contain: paint), which would
      // clip the readout and make the box its containing block.
      const box = out.closest('.gl-figure-box');
      if (box) box.classList.add('gl-floating');
      out.classList.add('gl-float');
      out.style.left = '0px';
      out.style.top = '0px';
    }
  }

  // floatReadout puts the lifted readout beside the point (x, y) of the
  // viewport.
  function floatReadout(x, y) {
    const out = byId('gl-readout');
    if (!out || !out.classList.contains('gl-float')) return;
    const w = out.offsetWidth;
    const h = out.offsetHeight;
    let left = x + READOUT_GAP;
    if (left + w > innerWidth - VIEW_MARGIN) left = x - READOUT_GAP - w;
    left = Math.max(VIEW_MARGIN, Math.min(left, innerWidth - VIEW_MARGIN - w));
    let top = y + READOUT_GAP;
    if (top + h > innerHeight - VIEW_MARGIN) top = y - READOUT_GAP - h;
    top = Math.max(VIEW_MARGIN, Math.min(top, innerHeight - VIEW_MARGIN - h));
    // Fixed to the viewport unless an ancestor says otherwise: measure
    // where left and top are measured from.
    const at = out.getBoundingClientRect();
    const ox = at.left - (parseFloat(out.style.left) || 0);
    const oy = at.top - (parseFloat(out.style.top) || 0);
    out.style.left = left - ox + 'px';
    out.style.top = top - oy + 'px';
  }

  function dockReadout() {
    const out = byId('gl-readout');
    if (!out || !out.classList.contains('gl-float')) return;
    out.classList.remove('gl-float');
    out.style.left = '';
    out.style.top = '';
    if (out.parentElement) out.parentElement.style.minHeight = '';
    const box = out.closest('.gl-figure-box');
    if (box) box.classList.remove('gl-floating');
  }

  // A scroll moves the figure under a fixed readout: dock it until the
  // pointer moves again.
  addEventListener('scroll', dockReadout, { passive: true });

  // Opening a plan on one side of the comparison: a file dropped on a
  // side (.gl-cmp-side with its form.gl-cmp-open) is posted to that form's
  // action as its Open button would; a refusal shows the server's reason
  // beside the side's file control.
  function cmpSideOf(e) {
    const side = e.target.closest && e.target.closest('.gl-cmp-side');
    return side && side.querySelector('form.gl-cmp-open') ? side : null;
  }

  document.addEventListener('dragover', (e) => {
    const side = cmpSideOf(e);
    if (!side || !hasFiles(e)) return;
    e.preventDefault();
    e.dataTransfer.dropEffect = 'copy';
    side.classList.add('gl-drop-here');
  });

  document.addEventListener('dragleave', (e) => {
    const side = cmpSideOf(e);
    if (side && !(e.relatedTarget && side.contains(e.relatedTarget))) side.classList.remove('gl-drop-here');
  });

  document.addEventListener('drop', (e) => {
    const side = cmpSideOf(e);
    if (!side || !hasFiles(e)) return;
    e.preventDefault();
    side.classList.remove('gl-drop-here');
    const file = e.dataTransfer.files[0];
    if (file) openOnSide(side.querySelector('form.gl-cmp-open'), file);
  });

  // openOnSide is openFile for a compare side's Open form.
  async function openOnSide(form, file) {
    const refused = await postFile(form, file);
    if (!refused) return;
    const input = form.querySelector('input[type=file]');
    const fresh = input && refused.page.getElementById('n-' + input.id);
    const cur = input && byId('n-' + input.id);
    if (fresh && cur) {
      cur.replaceWith(document.adoptNode(fresh));
      input.focus();
      byId('n-' + input.id).scrollIntoView({ block: 'nearest' });
    } else {
      trouble('The server could not open ' + file.name + ' (' + refused.status + ').');
    }
  }
  // --- end of the readout beside the pointer ---
})();
