// The live page: one event stream from the station, no polling.
"use strict";
(function () {
  var $ = function (id) { return document.getElementById(id); };
  var NS = "http://www.w3.org/2000/svg";
  var W = 900, H = 300, L = 56, R = 12, T = 12, B = 30;
  var state = null, trail = { generation: -1, torque: [], blowMs: [], blowNm: [], pointMs: 2, running: false };

  function text(id, s) { $(id).textContent = s; }
  function el(name, attrs, parent) {
    var e = document.createElementNS(NS, name);
    for (var k in attrs) e.setAttribute(k, attrs[k]);
    if (parent) parent.appendChild(e);
    return e;
  }
  function lampClass(mode) { return mode === "STEADY" ? "on" : mode === "BLINKING" ? "blink" : "off"; }

  function showState(s) {
    state = s;
    var lamps = document.querySelectorAll("#tower .lamp");
    for (var i = 0; i < lamps.length; i++) {
      lamps[i].className = lamps[i].className.replace(/ (on|off|blink)/g, "") + " " + lampClass(s.tower_lamps[i]);
    }
    text("part", s.part_serial ? s.part_serial + " (" + s.model + ")" : "none");
    text("pattern", s.pattern || "-");
    text("pass", s.pass ? s.pass + " (" + s.pass_number + " of " + s.passes + "), program " + s.program : "-");
    text("now", s.phase.toLowerCase() + (s.prompted ? ": tighten " + s.prompted : "") + (s.rework ? ": rework " + s.rework : ""));
    text("tool", s.tool_enabled ? "enabled" : "disabled");
    var box = $("positions");
    box.textContent = "";
    for (var p = 0; p < s.positions.length; p++) {
      var d = document.createElement("span");
      d.className = "lamp pos " + lampClass(s.position_lamps[p]);
      d.textContent = s.positions[p];
      box.appendChild(d);
    }
    text("transducer", (s.signal_faults.length ? "FAULT " + s.signal_faults.join(" ") : "healthy") +
      (s.zero_nm !== null ? ", zero " + s.zero_nm.toFixed(1) + " N·m" : ""));
    text("toolhealth", s.tool_weak ? "weaker than its baseline" : "as its baseline");
    text("storage", s.storage === "OK" ? "room" : s.storage === "LOW" ? "running low" : "full");
    text("errors", s.station_errors ? s.station_errors + " cycle errors" : "no cycle errors");
    draw();
  }

  function showTrail(t) {
    if (t.generation !== trail.generation || t.from === 0) {
      trail = { generation: t.generation, torque: [], blowMs: [], blowNm: [], pointMs: t.point_ms, running: t.running };
    }
    Array.prototype.push.apply(trail.torque, t.torque_nm);
    Array.prototype.push.apply(trail.blowMs, t.blow_ms);
    Array.prototype.push.apply(trail.blowNm, t.blow_nm);
    trail.running = t.running;
    text("rundown", trail.generation > 0 ? (trail.running ? "under way, " : "last, ") + trail.blowNm.length + " blows" : "none yet");
    draw();
  }

  function draw() {
    var svg = $("trace");
    while (svg.firstChild) svg.removeChild(svg.firstChild);
    var n = trail.torque.length, spanMs = Math.max(200, n * trail.pointMs);
    var hi = 10;
    for (var i = 0; i < n; i++) hi = Math.max(hi, trail.torque[i]);
    var s = state || {};
    [s.torque_max_nm, s.shutoff_nm].forEach(function (v) { if (v !== null && v !== undefined) hi = Math.max(hi, v); });
    hi *= 1.08;
    var x = function (ms) { return L + ms / spanMs * (W - L - R); };
    var y = function (nm) { return H - B - Math.max(0, nm) / hi * (H - T - B); };
    el("rect", { "class": "plot", x: L, y: T, width: W - L - R, height: H - T - B }, svg);
    if (s.torque_min_nm !== null && s.torque_min_nm !== undefined) {
      el("rect", { "class": "window", x: L, y: y(s.torque_max_nm), width: W - L - R, height: y(s.torque_min_nm) - y(s.torque_max_nm) }, svg);
      line(svg, y(s.target_nm), "target", "target " + s.target_nm);
      if (s.shutoff_nm !== null) line(svg, y(s.shutoff_nm), "shutoff", "shut-off " + s.shutoff_nm);
    }
    for (var k = 0; k <= 4; k++) {
      var v = hi / 1.08 * k / 4;
      var t = el("text", { "class": "tick", x: L - 4, y: y(v) + 4, "text-anchor": "end" }, svg);
      t.textContent = Math.round(v);
      var m = el("text", { "class": "tick", x: x(spanMs * k / 4), y: H - B + 14, "text-anchor": "middle" }, svg);
      m.textContent = Math.round(spanMs * k / 4) + " ms";
    }
    var pts = [];
    for (var j = 0; j < n; j++) pts.push(x(j * trail.pointMs).toFixed(1) + "," + y(trail.torque[j]).toFixed(1));
    el("polyline", { "class": "curve", points: pts.join(" ") }, svg);
    for (var b = 0; b < trail.blowNm.length; b++) {
      var c = el("circle", { "class": "peak", cx: x(trail.blowMs[b]), cy: y(trail.blowNm[b]), r: 3.5 }, svg);
      el("title", {}, c).textContent = "blow " + (b + 1) + ": " + trail.blowNm[b] + " N·m";
    }
  }

  function line(svg, yy, cls, label) {
    el("line", { "class": cls, x1: L, x2: W - R, y1: yy, y2: yy }, svg);
    var t = el("text", { "class": "label " + cls, x: W - R - 4, y: yy - 3, "text-anchor": "end" }, svg);
    t.textContent = label;
  }

  function showJoints(list) {
    var body = $("joints");
    body.textContent = "";
    list.forEach(function (j) {
      var tr = document.createElement("tr");
      tr.className = j.verdict === "GO" ? "go" : "nogo";
      var cells = [j.seq, j.at.substring(0, 19).replace("T", " "), j.part_serial, j.position, j.pass,
        j.final_torque_nm.toFixed(1), j.blows, j.verdict, j.reasons.join(" ")];
      cells.forEach(function (c, i) {
        var td = document.createElement("td");
        if (i === 0) {
          var a = document.createElement("a");
          a.href = "/joint?id=" + encodeURIComponent(j.id);
          a.textContent = c;
          td.appendChild(a);
        } else {
          td.textContent = c;
        }
        tr.appendChild(td);
      });
      body.appendChild(tr);
    });
  }

  function showEvents(list) {
    var ul = $("events");
    ul.textContent = "";
    list.forEach(function (e) {
      var li = document.createElement("li");
      li.className = e.severity.toLowerCase();
      li.textContent = e.at.substring(11, 19) + " " + e.severity + " " + e.code + ": " + e.message;
      ul.appendChild(li);
    });
    if (!list.length) ul.textContent = "none";
  }

  var source = new EventSource("/events");
  source.addEventListener("state", function (m) { showState(JSON.parse(m.data)); });
  source.addEventListener("trail", function (m) { showTrail(JSON.parse(m.data)); });
  source.addEventListener("joints", function (m) { showJoints(JSON.parse(m.data)); });
  source.addEventListener("events", function (m) { showEvents(JSON.parse(m.data)); });
  source.addEventListener("full", function () { text("link", "too many pages open on this station: try again later"); source.close(); });
  source.onopen = function () { text("link", "live"); };
  source.onerror = function () { text("link", "station not reachable: retrying"); };
})();
