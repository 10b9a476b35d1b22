// The one-way layers of Pivotwatch as eslint-plugin-import `no-restricted-paths` zones. DEVELOPERS.md
// ("Layers") draws the same picture; tests/lint/layers.test.ts plants violations and expects them to fail.
const fs = require('fs');
const path = require('path');

/** Features from the bottom up: a feature may import the ones before it, never the ones after it. */
const featureOrder = [
  'ledger',
  'session',
  'api',
  'auth',
  'settings',
  'admin',
  'photos',
  'documents',
  'tap-timer',
  'loads',
  'fatigue',
  'rides',
  'registry',
  'bulletins',
  'calculator',
  'records',
  'device-db',
  'instruments',
  'motion-recording',
  'sync',
  'pivot-life',
  'parts',
  'notices',
  'incidents',
  'review',
  'inspections',
  'logbook',
  'daily-checks',
  'ride-page',
  'home',
  'shell',
];

/** The server's folders and top-level modules from the bottom up, the same rule as the features'. */
const serverOrder = [
  'storage-url',
  'config',
  'paths',
  'files',
  'storage',
  'logger',
  'sql-functions',
  'db',
  'sqlite-client',
  'ledger',
  'backup',
  'mail',
  'deps',
  'http',
  'documents',
  'compute',
  'auth',
  'pdf',
  'schedule-due',
  'queue',
  'registry',
  'bulletins',
  'instruments',
  'findings',
  'pivot-life',
  'parts',
  'sync',
  'daily-checks',
  'notices',
  'review',
  'incidents',
  'setups',
  'reports',
  'logbook',
  'seed',
  'routes',
  'web',
  'app',
  'main',
];

/**
 * The contracts: zod shapes shared by the phone and the server, and the pure load engine. The server, db/
 * and any feature at or above the contract's own may import them directly; they import only lib/ and other
 * contracts.
 */
const contractGlobs = [
  'features/*/schema.ts',
  'features/*/*-schema.ts',
  'features/*/schema/**',
  'features/loads/engine/**',
];

function layerZones(root) {
  const abs = (p) => path.join(root, p);
  const contracts = contractGlobs.map(abs);
  const zones = [
    {
      target: './lib',
      from: ['./features', './components', './app', './server', './db', './scripts', './bench', './tests'],
      message: 'lib/ holds pure helpers and imports nothing of ours.',
    },
    {
      target: './components',
      from: ['./features', './app', './server', './db', './scripts', './bench', './tests'],
      message: 'components/ is the UI kit: it imports lib/ only, never a feature.',
    },
    {
      target: './features',
      from: ['./app', './server', './db/server', './scripts', './bench', './tests'],
      message: 'features/ never imports routes, the server, scripts or tests.',
    },
    {
      target: './server',
      from: ['./app', './components', './tests'],
      message:
        'The server imports lib/, db/, feature contracts and pure feature modules; never React UI or routes.',
    },
    {
      target: './db',
      from: ['./app', './components', './server', './scripts', './bench', './tests'],
      message: 'db/ imports lib/ and feature contracts only.',
    },
    {
      target: './db',
      from: abs('features/**'),
      except: contracts,
      message: 'db/ imports lib/ and feature contracts only.',
    },
    {
      target: ['./app', './scripts', './bench'],
      from: './tests',
      message: 'Nothing outside tests/ imports from tests/.',
    },
    {
      target: contracts,
      from: [abs('features/**'), abs('components/**'), abs('app/**'), abs('server/**')],
      except: contracts,
      message: 'A contract (schema or engine) imports only lib/ and other contracts.',
    },
  ];
  // Between features, only the other feature's public API (index.ts, ui.ts, and ui-<area>.ts for UI that
  // one area alone shows, kept out of the shared chunk) and its contracts. The shell's
  // bundles (features/shell/bundles/) are the exception: they stand in for the route files, which import
  // screens directly, and group them into the web export's lazily loaded chunks.
  featureOrder.forEach((feature) => {
    zones.push({
      target:
        feature === 'shell'
          ? ['./features/shell/*', './features/shell/!(bundles)/**']
          : `./features/${feature}`,
      from: featureOrder.filter((f) => f !== feature).map((f) => abs(`features/${f}/**`)),
      except: [...contracts, abs('features/*/index.ts'), abs('features/*/ui.ts'), abs('features/*/ui-*.ts')],
      message: `Another feature is used through its index.ts, ui.ts or ui-<area>.ts (its public API) or its contracts.`,
    });
  });
  featureOrder.forEach((feature, i) => {
    const higher = featureOrder.slice(i + 1);
    if (higher.length === 0) return;
    zones.push({
      target: `./features/${feature}`,
      from: higher.map((f) => abs(`features/${f}/**`)),
      message: `features/${feature} sits below ${higher.join(', ')} (DEVELOPERS.md, "Layers"): move what it needs down.`,
    });
  });
  const serverPath = (name) => {
    const folder = path.join(root, 'server', name);
    return fs.existsSync(folder) ? `./server/${name}` : `./server/${name}.ts`;
  };
  serverOrder.forEach((entry, i) => {
    const higher = serverOrder.slice(i + 1);
    if (higher.length === 0) return;
    zones.push({
      target: serverPath(entry),
      from: higher.map(serverPath),
      message: `server/${entry} sits below ${higher.join(', ')} (DEVELOPERS.md, "Layers").`,
    });
  });
  return zones;
}

module.exports = { featureOrder, serverOrder, contractGlobs, layerZones };
