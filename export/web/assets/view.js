// view.html's script (pqfab): draws the net from the JSON in #data with
// three.js, which sits in the page as text (#three-src, #orbit-src) and is
// loaded from blob: URLs, so the page needs no file and no network. The
// search and the part data work without 3D graphics: where the browser
// has no WebGL (or no JavaScript modules) the view says so and the rest
// of the page works as before.
(async function () {
  'use strict';
  const $ = (id) => document.getElementById(id);
  const status = (text, bad) => { $('status').textContent = text; $('status').style.color = bad ? '#a00' : '#555'; };
  const D = JSON.parse($('data').textContent);
  $('caution').textContent = 'Caution: ' + D.caution + (D.warnings && D.warnings.length ? ' ' + D.warnings.join(' ') : '');

  // 3D needs WebGL: ask a canvas first, so a browser without it gets a
  // message, not an error from the library.
  let THREE, OrbitControls, no3D = '';
  const probe = document.createElement('canvas');
  if (!window.WebGLRenderingContext || !(probe.getContext('webgl2') || probe.getContext('webgl'))) {
    no3D = 'this browser has no WebGL (3D graphics are off or not supported)';
  } else {
    try {
      const blobURL = (text) => URL.createObjectURL(new Blob([text], { type: 'text/javascript' }));
      const threeURL = blobURL($('three-src').textContent);
      THREE = await import(threeURL);
      const orbit = $('orbit-src').textContent.replace("from 'three'", "from '" + threeURL + "'");
      ({ OrbitControls } = await import(blobURL(orbit)));
    } catch (e) {
      no3D = 'this browser cannot load JavaScript modules (' + e + ')';
    }
  }

  const N = D.nodes, M = D.members, P = D.panels;
  const nn = N.label.length, nm = M.label.length, np = P.label.length;
  const counts = nn + ' nodes, ' + nm + ' members, ' + np + ' panels.';

  // Labels to parts.
  const byLabel = new Map();
  N.label.forEach((l, i) => byLabel.set(l, { kind: 'node', i }));
  M.label.forEach((l, i) => byLabel.set(l, { kind: 'member', i }));
  P.label.forEach((l, i) => byLabel.set(l, { kind: 'panel', i }));

  const xyz = new Float32Array(N.xyz);
  let span = 0;
  for (let k = 0; k < nm; k++) {
    const a = 3 * M.a[k], b = 3 * M.b[k];
    span += Math.hypot(xyz[b] - xyz[a], xyz[b + 1] - xyz[a + 1], xyz[b + 2] - xyz[a + 2]);
  }
  span = nm > 0 ? span / nm : 1000;
  let radius = span;
  for (let i = 0; i < xyz.length; i++) radius = Math.max(radius, Math.abs(xyz[i]));

  const host = $('view');
  const vec = (i) => [xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2]];
  const mm = (v) => (v + 0).toFixed(0);

  // start3D builds the scene; it returns what the page needs of it:
  // colour(mode), show(hit) to highlight a part and turn to it, clear().
  function start3D() {
    const renderer = new THREE.WebGLRenderer({ antialias: true, preserveDrawingBuffer: true });
    renderer.setPixelRatio(window.devicePixelRatio || 1);
    host.appendChild(renderer.domElement);
    const scene = new THREE.Scene();
    scene.background = new THREE.Color(0xf4f4f2);
    const camera = new THREE.PerspectiveCamera(40, 1, radius / 1000, radius * 20);
    camera.up.set(0, 0, 1);
    camera.position.set(-1.2 * radius, -1.6 * radius, 1.1 * radius);
    const controls = new OrbitControls(camera, renderer.domElement);
    controls.target.set(0, 0, 0);
    scene.add(new THREE.AmbientLight(0xffffff, 1.6));
    const sun = new THREE.DirectionalLight(0xffffff, 1.4);
    sun.position.set(-0.4, -0.6, 1);
    scene.add(sun);

    // Panels: one triangle fan per panel, colours per vertex.
    let tris = 0;
    for (let p = 0; p < np; p++) tris += P.start[p + 1] - P.start[p] - 2;
    const panelPos = new Float32Array(9 * tris), panelCol = new Float32Array(9 * tris);
    const panelOfTri = new Int32Array(tris);
    let t = 0;
    for (let p = 0; p < np; p++) {
      const s = P.start[p], e = P.start[p + 1];
      for (let k = s + 1; k + 1 < e; k++) {
        for (const [j, c] of [P.corner[s], P.corner[k], P.corner[k + 1]].entries()) {
          panelPos.set(xyz.subarray(3 * c, 3 * c + 3), 9 * t + 3 * j);
        }
        panelOfTri[t++] = p;
      }
    }
    const panelGeo = new THREE.BufferGeometry();
    panelGeo.setAttribute('position', new THREE.BufferAttribute(panelPos, 3));
    panelGeo.setAttribute('color', new THREE.BufferAttribute(panelCol, 3));
    panelGeo.computeVertexNormals();
    const panelMesh = new THREE.Mesh(panelGeo, new THREE.MeshLambertMaterial({
      vertexColors: true, side: THREE.DoubleSide, polygonOffset: true, polygonOffsetFactor: 1, polygonOffsetUnits: 1 }));
    scene.add(panelMesh);

    const memberPos = new Float32Array(6 * nm), memberCol = new Float32Array(6 * nm);
    for (let k = 0; k < nm; k++) {
      memberPos.set(xyz.subarray(3 * M.a[k], 3 * M.a[k] + 3), 6 * k);
      memberPos.set(xyz.subarray(3 * M.b[k], 3 * M.b[k] + 3), 6 * k + 3);
    }
    const memberGeo = new THREE.BufferGeometry();
    memberGeo.setAttribute('position', new THREE.BufferAttribute(memberPos, 3));
    memberGeo.setAttribute('color', new THREE.BufferAttribute(memberCol, 3));
    scene.add(new THREE.LineSegments(memberGeo, new THREE.LineBasicMaterial({ vertexColors: true })));

    const nodeCol = new Float32Array(3 * nn);
    const nodeGeo = new THREE.BufferGeometry();
    nodeGeo.setAttribute('position', new THREE.BufferAttribute(xyz, 3));
    nodeGeo.setAttribute('color', new THREE.BufferAttribute(nodeCol, 3));
    const nodePoints = new THREE.Points(nodeGeo, new THREE.PointsMaterial({ vertexColors: true, size: 5, sizeAttenuation: false }));
    scene.add(nodePoints);

    // Colours: by type (a hue per type, golden-ratio steps) or by node move
    // (a ramp from no move to the largest; panels and members take the
    // largest move of their nodes).
    const tmp = new THREE.Color();
    const typeColour = (k, l) => tmp.setHSL((k * 0.618033988749895) % 1, 0.55, l);
    const ramp = [[0.157, 0.314, 0.784], [0.188, 0.69, 0.627], [0.91, 0.816, 0.251], [0.847, 0.188, 0.125]];
    const rampColour = (x) => {
      x = Math.min(1, Math.max(0, x)) * 3;
      const i = Math.min(2, Math.floor(x)), f = x - i;
      return tmp.setRGB(...ramp[i].map((v, c) => v + f * (ramp[i + 1][c] - v)));
    };
    let maxMove = 0;
    for (const v of N.move) maxMove = Math.max(maxMove, v);
    function colour(mode) {
      const legend = $('legend');
      legend.textContent = '';
      if (mode === 'move') {
        const norm = (v) => maxMove > 0 ? v / maxMove : 0;
        for (let i = 0; i < nn; i++) rampColour(norm(N.move[i])).toArray(nodeCol, 3 * i);
        for (let k = 0; k < nm; k++) {
          const c = rampColour(norm(Math.max(N.move[M.a[k]], N.move[M.b[k]])));
          c.toArray(memberCol, 6 * k); c.toArray(memberCol, 6 * k + 3);
        }
        let tri = 0;
        for (let p = 0; p < np; p++) {
          let mv = 0;
          for (let k = P.start[p]; k < P.start[p + 1]; k++) mv = Math.max(mv, N.move[P.corner[k]]);
          const c = rampColour(norm(mv));
          for (let k = P.start[p] + 2; k < P.start[p + 1]; k++, tri++) for (let j = 0; j < 3; j++) c.toArray(panelCol, 9 * tri + 3 * j);
        }
        const r = document.createElement('div');
        r.className = 'ramp';
        legend.append('node move (panels and members: the largest of their nodes)', r, '0 mm … ' + maxMove.toFixed(2) + ' mm');
      } else {
        for (let i = 0; i < nn; i++) typeColour(N.type[i], 0.35).toArray(nodeCol, 3 * i);
        for (let k = 0; k < nm; k++) {
          typeColour(M.type[k], 0.38).toArray(memberCol, 6 * k); typeColour(M.type[k], 0.38).toArray(memberCol, 6 * k + 3);
        }
        let tri = 0;
        for (let p = 0; p < np; p++) {
          typeColour(P.type[p], 0.72);
          for (let k = P.start[p] + 2; k < P.start[p + 1]; k++, tri++) for (let j = 0; j < 3; j++) tmp.toArray(panelCol, 9 * tri + 3 * j);
        }
        legend.textContent = 'Each part type has its own colour (' + D.types.length + ' types of nodes, members and panels).';
      }
      nodeGeo.attributes.color.needsUpdate = true;
      memberGeo.attributes.color.needsUpdate = true;
      panelGeo.attributes.color.needsUpdate = true;
      render();
    }

    // Selection in the scene: a highlight, and the camera turned to it.
    const highlight = new THREE.Group();
    scene.add(highlight);
    const hiMat = new THREE.MeshBasicMaterial({ color: 0xff6a00, side: THREE.DoubleSide, depthTest: false, transparent: true, opacity: 0.9 });
    const v3 = (i) => new THREE.Vector3(...vec(i));
    function show(hit) {
      highlight.clear();
      if (!hit) { render(); return; }
      let centre;
      if (hit.kind === 'node') {
        const s = new THREE.Mesh(new THREE.SphereGeometry(span * 0.12, 16, 12), hiMat);
        s.position.copy(v3(hit.i));
        highlight.add(s);
        centre = s.position.clone();
      } else if (hit.kind === 'member') {
        const k = hit.i, a = v3(M.a[k]), b = v3(M.b[k]);
        const c = new THREE.Mesh(new THREE.CylinderGeometry(span * 0.04, span * 0.04, a.distanceTo(b), 10), hiMat);
        c.position.copy(a).add(b).multiplyScalar(0.5);
        c.quaternion.setFromUnitVectors(new THREE.Vector3(0, 1, 0), b.clone().sub(a).normalize());
        highlight.add(c);
        centre = c.position.clone();
      } else {
        const p = hit.i, s = P.start[p], e = P.start[p + 1];
        const pos = [];
        for (let k = s + 1; k + 1 < e; k++) for (const c of [P.corner[s], P.corner[k], P.corner[k + 1]]) pos.push(...vec(c));
        const g = new THREE.BufferGeometry();
        g.setAttribute('position', new THREE.Float32BufferAttribute(pos, 3));
        highlight.add(new THREE.Mesh(g, hiMat));
        centre = new THREE.Vector3();
        for (let k = s; k < e; k++) centre.add(v3(P.corner[k]));
        centre.multiplyScalar(1 / (e - s));
      }
      // Look at the part from where the camera is, a few spans away.
      const dir = camera.position.clone().sub(controls.target).normalize();
      controls.target.copy(centre);
      camera.position.copy(centre).addScaledVector(dir, 10 * span);
      controls.update();
      render();
    }

    function render() {
      renderer.render(scene, camera);
    }
    function resize() {
      const w = host.clientWidth || window.innerWidth, h = host.clientHeight || window.innerHeight;
      renderer.setSize(w, h);
      camera.aspect = w / Math.max(h, 1);
      camera.updateProjectionMatrix();
      render();
    }
    window.addEventListener('resize', resize);
    controls.addEventListener('change', render);

    // Click (not drag) picks a node, or else a panel.
    const ray = new THREE.Raycaster();
    let down = null;
    renderer.domElement.addEventListener('pointerdown', (e) => { down = [e.clientX, e.clientY]; });
    renderer.domElement.addEventListener('pointerup', (e) => {
      if (!down || Math.hypot(e.clientX - down[0], e.clientY - down[1]) > 4) return;
      const r = renderer.domElement.getBoundingClientRect();
      ray.setFromCamera(new THREE.Vector2(((e.clientX - r.left) / r.width) * 2 - 1, -((e.clientY - r.top) / r.height) * 2 + 1), camera);
      ray.params.Points.threshold = span * 0.15;
      const hits = ray.intersectObjects([nodePoints, panelMesh], false);
      const node = hits.find((h) => h.object === nodePoints);
      if (node) select(N.label[node.index]);
      else if (hits.length) select(P.label[panelOfTri[hits[0].faceIndex]]);
    });
    resize();
    return { colour, show };
  }

  let view = null;
  if (!no3D) {
    try {
      view = start3D();
    } catch (e) {
      no3D = 'the browser could not start 3D graphics (' + e.message + ')';
    }
  }
  if (!view) {
    // No 3D: say so where the view would be; search and data still work.
    host.textContent = '';
    const msg = document.createElement('p');
    msg.id = 'no3d';
    msg.textContent = 'No 3D view: ' + no3D + '. Find a part by its label on the left: its data is shown there.';
    host.append(msg);
    $('colour').disabled = true;
    document.body.dataset.view = 'none';
  } else {
    document.body.dataset.view = '3d';
  }

  // The part's data in #info.
  function row(table, cells, header) {
    const tr = table.insertRow();
    cells.forEach((c, j) => {
      const td = document.createElement(header ? 'th' : 'td');
      td.textContent = c;
      if (!header && j > 0 && /^[-+0-9.]+$/.test(c)) td.className = 'n';
      tr.append(td);
    });
  }

  function select(label) {
    const key = (label || '').trim().toUpperCase();
    const hit = byLabel.get(key);
    const info = $('info');
    info.textContent = '';
    delete document.body.dataset.selected;
    delete document.body.dataset.kind;
    if (!hit) {
      const near = [];
      for (const l of byLabel.keys()) { if (key && l.startsWith(key)) { near.push(l); if (near.length === 8) break; } }
      status(key ? 'No part is labelled ' + key + '.' + (near.length ? ' Labels starting so: ' + near.join(', ') : '') : '', !!key);
      if (view) view.show(null);
      return false;
    }
    status(counts);
    const h2 = document.createElement('h2');
    h2.textContent = key;
    const table = document.createElement('table');
    info.append(h2, table);
    if (hit.kind === 'node') {
      const i = hit.i;
      row(table, ['node', D.types[N.type[i]]]);
      row(table, ['bay', key.split('-')[0]]);
      row(table, ['x, y, z (mm)', mm(xyz[3 * i] + D.centre[0]) + ', ' + mm(xyz[3 * i + 1] + D.centre[1]) + ', ' + mm(xyz[3 * i + 2] + D.centre[2])]);
      row(table, ['axis tilt (°)', N.tilt[i].toFixed(1) + (N.tilt[i] > 0 ? ' toward ' + N.tilt_to[i].toFixed(0) + ' ccw from north' : '')]);
      row(table, ['move (mm)', N.move[i].toFixed(2)]);
      if (N.support.includes(i)) row(table, ['support', 'yes']);
      const arms = document.createElement('table');
      row(arms, ['member', 'az °', 'el °'], true);
      for (let k = N.arm_start[i]; k < N.arm_start[i + 1]; k++) row(arms, [M.label[N.arm_member[k]], N.arm_az[k].toFixed(1), N.arm_el[k].toFixed(1)]);
      const note = document.createElement('p');
      note.className = 'small';
      note.textContent = D.hub;
      info.append(arms, note);
    } else if (hit.kind === 'member') {
      const k = hit.i, tagB = M.tag_b.includes(k);
      row(table, ['member', D.types[M.type[k]]]);
      row(table, ['bay', key.split('-')[0]]);
      row(table, ['tag end (type end A) to node', N.label[tagB ? M.b[k] : M.a[k]]]);
      row(table, ['other end to node', N.label[tagB ? M.a[k] : M.b[k]]]);
      row(table, ['end A to node', N.label[M.a[k]]]);
      row(table, ['end B to node', N.label[M.b[k]]]);
      row(table, ['cut length (mm)', M.cut[k].toFixed(1)]);
    } else {
      const p = hit.i, s = P.start[p], e = P.start[p + 1];
      const corners = [];
      for (let k = s; k < e; k++) corners.push(N.label[P.corner[k]]);
      row(table, ['panel', D.types[P.type[p]]]);
      row(table, ['bay', key.split('-')[0]]);
      row(table, ['corners 1-' + (e - s), corners.join(' ')]);
      row(table, ['sheet', P.sheet[p] >= 0 ? D.sheets[P.sheet[p]] : 'none']);
      row(table, ['area (m²)', P.area[p].toFixed(3)]);
    }
    document.body.dataset.selected = key;
    document.body.dataset.kind = hit.kind;
    $('q').value = key;
    if (view) view.show(hit);
    return true;
  }

  if (view) {
    $('colour').addEventListener('change', (e) => view.colour(e.target.value));
    view.colour('type');
  }
  $('find').addEventListener('submit', (e) => {
    e.preventDefault();
    if (select($('q').value)) history.replaceState(null, '', '#' + encodeURIComponent(document.body.dataset.selected));
  });
  status(counts + (view ? '' : ' No 3D view: search and data only.'), !view);
  if (location.hash.length > 1) select(decodeURIComponent(location.hash.slice(1)));
  document.body.dataset.ready = '1';
})();
