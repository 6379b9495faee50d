import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { join } from 'node:path';

/**
 * Two Syncthing instances (Debian package `syncthing`) that sync one folder with each other on loopback only:
 * global and local discovery, relays, NAT traversal, usage reports and upgrades are off, each knows the
 * other's address. Each instance's configuration is written here in full (the keys come from
 * `syncthing generate`), so the test does not depend on the defaults of one Syncthing version.
 */
export interface SyncthingPair {
  folders: [string, string];
  pids: number[];
  stop(): Promise<void>;
}

const CONNECT_MS = 60_000;

/**
 * `count` distinct free ports on loopback. Every listener stays open until all are chosen: one closed before the
 * next was asked for could be handed out again, and once an instance's API port was its own sync port (the API
 * then failed to start and the pair never connected).
 */
async function freePorts(count: number): Promise<number[]> {
  const servers = await Promise.all(
    Array.from(
      { length: count },
      () =>
        new Promise<Server>((resolve, reject) => {
          const server = createServer();
          server.once('error', reject);
          server.listen(0, '127.0.0.1', () => resolve(server));
        })
    )
  );
  const ports = servers.map((server) => {
    const address = server.address();
    return typeof address === 'object' && address ? address.port : 0;
  });
  await Promise.all(servers.map((server) => new Promise((resolve) => server.close(resolve))));
  return ports;
}

function configXml(options: {
  folder: string;
  self: { id: string; port: number };
  other: { id: string; port: number };
  guiPort: number;
}): string {
  const { folder, self, other, guiPort } = options;
  return `<configuration version="36">
    <folder id="capstan-shared" label="capstan-shared" path="${folder}" type="sendreceive" rescanIntervalS="2" fsWatcherEnabled="true" fsWatcherDelayS="1" ignorePerms="false" autoNormalize="true">
        <filesystemType>basic</filesystemType>
        <device id="${self.id}"></device>
        <device id="${other.id}"></device>
        <minDiskFree unit="%">0</minDiskFree>
    </folder>
    <device id="${self.id}" name="self" compression="metadata" introducer="false">
        <address>dynamic</address>
    </device>
    <device id="${other.id}" name="other" compression="metadata" introducer="false">
        <address>tcp://127.0.0.1:${other.port}</address>
    </device>
    <gui enabled="true" tls="false">
        <address>127.0.0.1:${guiPort}</address>
        <apikey>capstan-test-${self.port}</apikey>
    </gui>
    <options>
        <listenAddress>tcp://127.0.0.1:${self.port}</listenAddress>
        <globalAnnounceEnabled>false</globalAnnounceEnabled>
        <localAnnounceEnabled>false</localAnnounceEnabled>
        <relaysEnabled>false</relaysEnabled>
        <natEnabled>false</natEnabled>
        <startBrowser>false</startBrowser>
        <urAccepted>-1</urAccepted>
        <crashReportingEnabled>false</crashReportingEnabled>
        <autoUpgradeIntervalH>0</autoUpgradeIntervalH>
        <minHomeDiskFree unit="%">0</minHomeDiskFree>
        <setLowPriority>false</setLowPriority>
        <reconnectionIntervalS>1</reconnectionIntervalS>
    </options>
</configuration>
`;
}

export async function startSyncthingPair(work: string): Promise<SyncthingPair> {
  const homes = [join(work, 'home-a'), join(work, 'home-b')] as const;
  const folders: [string, string] = [join(work, 'folder-a'), join(work, 'folder-b')];
  const ids = homes.map((home) => {
    execFileSync('syncthing', ['generate', `--home=${home}`, '--no-default-folder', '--skip-port-probing'], {
      stdio: 'ignore'
    });
    return execFileSync('syncthing', ['serve', `--home=${home}`, '--device-id'], { encoding: 'utf8' }).trim();
  });
  const [syncA, syncB, guiA, guiB] = await freePorts(4);
  const ports = [syncA!, syncB!];
  const guiPorts = [guiA!, guiB!];
  const children: ChildProcess[] = [];
  for (const i of [0, 1]) {
    // The folder marker Syncthing expects in a folder it did not create.
    mkdirSync(join(folders[i]!, '.stfolder'), { recursive: true });
    writeFileSync(
      join(homes[i]!, 'config.xml'),
      configXml({
        folder: folders[i]!,
        self: { id: ids[i]!, port: ports[i]! },
        other: { id: ids[1 - i]!, port: ports[1 - i]! },
        guiPort: guiPorts[i]!
      })
    );
    const child = spawn(
      'syncthing',
      [
        'serve',
        `--home=${homes[i]}`,
        '--no-browser',
        '--no-restart',
        '--no-upgrade',
        `--logfile=${join(work, `log-${i}.txt`)}`
      ],
      { stdio: 'ignore', env: { ...process.env, STNOUPGRADE: '1', STNORESTART: '1' } }
    );
    children.push(child);
  }
  const pair: SyncthingPair = {
    folders,
    pids: children.map((c) => c.pid!).filter(Boolean),
    stop: async () => {
      await Promise.all(
        children.map(
          (child) =>
            new Promise<void>((resolve) => {
              if (child.exitCode !== null || child.signalCode !== null) return resolve();
              const timer = setTimeout(() => {
                try {
                  process.kill(child.pid!, 'SIGKILL');
                } catch {
                  // already gone
                }
              }, 5000);
              child.once('exit', () => {
                clearTimeout(timer);
                resolve();
              });
              process.kill(child.pid!, 'SIGTERM');
            })
        )
      );
    }
  };
  // Ready once each instance reports the other connected (its REST API, on loopback with its own key).
  const started = Date.now();
  const connected = async (i: number) => {
    try {
      const response = await fetch(`http://127.0.0.1:${guiPorts[i]}/rest/system/connections`, {
        headers: { 'X-API-Key': `capstan-test-${ports[i]}` }
      });
      const body = (await response.json()) as { connections: Record<string, { connected: boolean }> };
      return body.connections[ids[1 - i]!]?.connected === true;
    } catch {
      return false;
    }
  };
  while (!((await connected(0)) && (await connected(1)))) {
    if (Date.now() - started > CONNECT_MS) {
      await pair.stop();
      throw new Error(
        `The two Syncthing instances did not connect within ${CONNECT_MS / 1000} s (logs in ${work})`
      );
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return pair;
}
