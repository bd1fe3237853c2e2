// Preloaded into a child process: records any file read outside the allowed roots and any
// network use, and reports them on stderr as one JSON line at exit. Used by the hostile-input tests.
import fs from 'node:fs';
import net from 'node:net';
import http from 'node:http';
import https from 'node:https';
import { resolve } from 'node:path';
import { syncBuiltinESMExports } from 'node:module';

const allowed = (process.env.PLUMBLINE_TRAP_ALLOW ?? '').split(':').filter(Boolean).map((p) => resolve(p));
const violations = [];
const check = (what, p) => {
  if (typeof p !== 'string' && !(p instanceof URL) && !Buffer.isBuffer(p)) return;
  const s = p instanceof URL ? p.pathname : String(p);
  const abs = resolve(s);
  if (abs.startsWith('/proc/') || abs.startsWith('/dev/') || abs === '/etc/localtime') return;
  // Looking for a configuration file up the folder tree is by design.
  if (what === 'existsSync' && abs.endsWith('/plumbline.config.json')) return;
  if (!allowed.some((a) => abs === a || abs.startsWith(a + '/'))) violations.push(`${what} ${abs}`);
};
for (const name of ['readFileSync', 'openSync', 'readFile', 'open', 'createReadStream', 'statSync', 'existsSync']) {
  const orig = fs[name];
  fs[name] = function (p, ...rest) { check(name, p); return orig.call(this, p, ...rest); };
}
const promises = fs.promises;
for (const name of ['readFile', 'open']) {
  const orig = promises[name];
  promises[name] = function (p, ...rest) { check(`promises.${name}`, p); return orig.call(this, p, ...rest); };
}
syncBuiltinESMExports();
const netTrap = (what) => function () { violations.push(`network ${what}`); throw new Error(`network use is not allowed: ${what}`); };
net.Socket.prototype.connect = netTrap('socket.connect');
net.connect = netTrap('net.connect');
net.createConnection = netTrap('net.createConnection');
http.request = netTrap('http.request');
http.get = netTrap('http.get');
https.request = netTrap('https.request');
https.get = netTrap('https.get');
globalThis.fetch = netTrap('fetch');
process.on('exit', () => { process.stderr.write(`\nTRAP ${JSON.stringify(violations)}\n`); });
