import fs from 'node:fs';
import type { Server } from 'node:http';
import { isIP, type AddressInfo } from 'node:net';
import path from 'node:path';

import { createApp } from '@/server/app';
import { DataDirBusyError, lockDataDir, startBackupJob } from '@/server/backup';
import { ConfigError, demoSeedingReason, loadConfig, type Config, type Env } from '@/server/config';
import { openDb } from '@/server/db';
import { makePrivateDir, restrictNewFiles } from '@/server/files';
import { createLogger, type Logger } from '@/server/logger';
import { startMailService } from '@/server/mail';
import { releaseInterruptedSends } from '@/server/mail/deliver';
import { startAccountMailLoop } from '@/server/auth/account-mail';
import { startDeliveryLoop } from '@/server/notices/deliveries';
import { startReminderJob } from '@/server/notices/reminders';
import { backfillRideLifeFlags } from '@/server/pivot-life/flags';
import { numberRideFindings } from '@/server/findings/findings';
import { ensureQueueFresh, queueToday } from '@/server/queue/queue-refresh';
import { seedDemoData } from '@/server/seed/demo';
import { StorageError, storageOf } from '@/server/storage';
import { startPhotoCleanup } from '@/server/sync/photo-cleanup';

export type StartOptions = {
  /** Overrides on top of `process.env` (e.g. `{ PORT: '0', DATA_DIR: tmp }` in tests). */
  env?: Env;
  /** Stop cleanly on SIGINT/SIGTERM and exit; default true. Harnesses that manage the process pass false. */
  handleSignals?: boolean;
  logger?: Logger;
};

export type RunningServer = {
  /** The port actually bound (useful with PORT=0). */
  port: number;
  url: string;
  config: Config;
  /** Stops accepting connections, lets in-flight requests finish, closes the database. Idempotent. */
  close: () => Promise<void>;
};

/** How long in-flight requests get on shutdown before their connections are cut. */
const shutdownGraceMs = 10_000;

/** Opens and migrates the database, seeds the demo scenario when allowed, and listens on PORT. */
export async function startServer(opts: StartOptions = {}): Promise<RunningServer> {
  restrictNewFiles();
  const config = loadConfig({ ...process.env, ...opts.env });
  const logger = opts.logger ?? createLogger(config);
  // Photos, NDT reports and notice PDFs (STORAGE_URL): out of reach means nothing could be stored, so stop.
  const storage = storageOf(config);
  await storage.check();
  logger.info({ storage: storage.description }, 'stored files are kept here');
  // One server per DATA_DIR (and none during a restore); the lock goes when the process does, however it ends.
  const privacy = makePrivateDir(config.dataDir);
  if (privacy === 'tightened')
    logger.warn({ dataDir: config.dataDir }, 'DATA_DIR was open to others; now 0700');
  if (privacy === 'failed')
    logger.warn({ dataDir: config.dataDir }, 'DATA_DIR is open to others; make it 0700');
  const dataDirLock = lockDataDir(config.dataDir);
  let opened: ReturnType<typeof openDb>;
  try {
    opened = openDb(config.dataDir, { backupDir: config.backupDir });
  } catch (error) {
    dataDirLock.release();
    throw error;
  }
  const database = {
    ...opened,
    close: () => {
      opened.close();
      dataDirLock.release();
    },
  };

  try {
    logger.info({ host: config.host, seedDemo: config.seedDemo }, demoSeedingReason(config));
    if (config.seedDemo) {
      const result = await seedDemoData(database.db, config);
      if (result === 'seeded') logger.info('seeded the demo scenario (password: pivotwatch-demo)');
    }
    // Holding DATA_DIR's lock, no earlier send can still be running: what a crash interrupted goes out now.
    const released = releaseInterruptedSends(database.sqlite, new Date());
    if (released > 0) logger.warn({ released }, 'e-mails interrupted by a stop are sent again');
    // Findings stored before rides numbered them get their number on the ride once, before anyone reads them.
    database.db.transaction((tx) => numberRideFindings(tx));
    // Rides stored before their pivot-life flags existed get them once (NDT due, wear), before the queue.
    backfillRideLifeFlags(database.db, queueToday());
    // The review queue is built before the first request, so no supervisor waits for a full rebuild.
    ensureQueueFresh(database.db, queueToday());
  } catch (error) {
    database.close();
    throw error;
  }

  // Production without SMTP_URL fails here, before anything listens.
  const mail = await startMailService({ config, dataDir: config.dataDir, logger }).catch((error: unknown) => {
    database.close();
    throw error;
  });

  const app = createApp({ db: database.db, config, logger, mail });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, (error?: Error) => (error ? reject(error) : resolve(s)));
  }).catch(async (error: unknown) => {
    await mail.close();
    database.close();
    throw error;
  });

  const port = (server.address() as AddressInfo).port;
  const url = localUrl(config.host, port);
  // Links in notices point at the port actually bound when APP_URL does not say otherwise (PORT=0 in tests).
  if (!(opts.env?.APP_URL ?? process.env.APP_URL)) config.appUrl = url;

  const deliveryLoop = startDeliveryLoop({
    db: database.db,
    mailer: mail.mailer,
    storage,
    logger,
  });
  // Invitations and reset links queued before a restart go out now; new ones as they are queued.
  const accountMailLoop = startAccountMailLoop({ db: database.db, mailer: mail.mailer, logger });
  const reminderJob = startReminderJob({ db: database.db, appUrl: config.appUrl, logger });
  const photoCleanup = startPhotoCleanup({
    db: database.db,
    storage,
    graceDays: config.photoGraceDays,
    logger,
  });
  const backupJob =
    config.backupIntervalSeconds > 0
      ? startBackupJob({
          sqlite: database.sqlite,
          storage,
          backupDir: config.backupDir,
          intervalMs: config.backupIntervalSeconds * 1000,
          keep: config.backupKeep,
          logger,
        })
      : null;
  if (!fs.existsSync(path.join(config.webDir, 'index.html'))) {
    logger.warn({ webDir: config.webDir }, 'no web export found; the API works, the app pages will not');
  }
  logger.info({ url, host: config.host, dataDir: config.dataDir }, 'Pivotwatch is listening');

  let closing: Promise<void> | undefined;
  const close = () => {
    closing ??= new Promise<void>((resolve) => {
      removeSignalHandlers();
      const force = setTimeout(() => server.closeAllConnections(), shutdownGraceMs);
      force.unref();
      reminderJob.stop();
      photoCleanup.stop();
      server.close(() => {
        clearTimeout(force);
        void Promise.all([deliveryLoop.stop(), accountMailLoop.stop()])
          .then(() => backupJob?.stop())
          .then(() => mail.close())
          .finally(() => {
            database.close();
            resolve();
          });
      });
      // Idle keep-alive connections would otherwise hold close() open until they time out.
      server.closeIdleConnections();
    });
    return closing;
  };

  const onSignal = (signal: NodeJS.Signals) => {
    logger.info({ signal }, 'shutting down');
    void close().then(() => process.exit(0));
  };
  const removeSignalHandlers = () => {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
  };
  if (opts.handleSignals ?? true) {
    process.once('SIGINT', onSignal);
    process.once('SIGTERM', onSignal);
  }

  return { port, url, config, close };
}

/**
 * An exception nothing caught, or a rejected promise nobody awaited, leaves the process in a state no one
 * planned for (a loop half-stopped, a connection in an unknown state). It is logged and the process exits
 * non-zero, for its supervisor (systemd, a container runtime) to start a clean one; every write is one
 * SQLite transaction, so nothing half-written outlives the exit. Returns the uninstaller.
 */
export function exitOnCrash(logger: Logger, exit: (code: number) => void = (code) => process.exit(code)) {
  const onCrash = (what: string) => (error: unknown) => {
    logger.fatal({ err: error }, `${what}; exiting so that a clean process is started`);
    exit(1);
  };
  const onException = onCrash('uncaught exception');
  const onRejection = onCrash('unhandled promise rejection');
  process.on('uncaughtException', onException);
  process.on('unhandledRejection', onRejection);
  return () => {
    process.off('uncaughtException', onException);
    process.off('unhandledRejection', onRejection);
  };
}

/** Where this machine reaches the server: a wildcard HOST (every interface) answers on loopback too. */
function localUrl(host: string, port: number): string {
  const reachable = host === '0.0.0.0' || host === '::' ? '127.0.0.1' : host;
  return `http://${isIP(reachable) === 6 ? `[${reachable}]` : reachable}:${port}`;
}

if (require.main === module) {
  // Fatal lines are written whatever LOG_LEVEL says, so the default level does for this logger.
  exitOnCrash(createLogger({ logLevel: 'info' }));
  startServer().catch((error: unknown) => {
    if (error instanceof ConfigError || error instanceof DataDirBusyError || error instanceof StorageError) {
      console.error(error.message);
    } else {
      console.error('Pivotwatch could not start:', error);
    }
    process.exit(1);
  });
}
