import { readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { describe, expect, it } from 'vitest';
import { freePort } from './process.mjs';

describe('freePort', () => {
  it('gives a loopback port one can listen on, below the range of outgoing source ports', async () => {
    // Linux keeps that range in /proc/sys/net/ipv4/ip_local_port_range (kernel documentation, ip-sysctl).
    const ephemeralLow = Number(readFileSync('/proc/sys/net/ipv4/ip_local_port_range', 'utf8').trim().split(/\s+/)[0]);
    const ports = await Promise.all(Array.from({ length: 5 }, () => freePort()));
    for (const port of ports) {
      expect(port).toBeGreaterThanOrEqual(10000);
      expect(port).toBeLessThan(ephemeralLow);
      const server = createServer();
      await new Promise<void>((resolve, reject) => {
        server.once('error', reject);
        server.listen(port, '127.0.0.1', resolve);
      });
      await new Promise((resolve) => server.close(resolve));
    }
  });
});
