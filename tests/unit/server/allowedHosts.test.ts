import { describe, expect, it } from 'vitest';
import { allowedHostNames, parseHostHeader } from '../../../server/http/allowedHosts';

describe('parseHostHeader', () => {
  it.each([
    ['localhost:3000', { hostname: 'localhost', port: '3000' }],
    ['LocalHost', { hostname: 'localhost', port: null }],
    ['localhost.:80', { hostname: 'localhost', port: '80' }],
    ['[::1]:5173', { hostname: '::1', port: '5173' }],
    ['192.168.1.10', { hostname: '192.168.1.10', port: null }],
  ])('reads %s', (header, parts) => {
    expect(parseHostHeader(header)).toEqual(parts);
  });

  it.each([undefined, '', 'user@localhost', 'localhost/x', 'local host', 'localhost:', 'localhost:abc', '::1', '[::1', 'a:1:2'])('refuses %j', (header) => {
    expect(parseHostHeader(header)).toBeNull();
  });
});

describe('allowedHostNames', () => {
  it('defaults to the loopback names (HOST defaults to 127.0.0.1)', () => {
    expect([...allowedHostNames({ HOST: '127.0.0.1', PUBLIC_URL: undefined, ALLOWED_HOSTS: undefined })].sort()).toEqual(['127.0.0.1', '::1', 'localhost']);
  });

  it('adds HOST unless it is a wildcard address, PUBLIC_URL host and every ALLOWED_HOSTS entry (ports and schemes dropped)', () => {
    const names = allowedHostNames({ HOST: 'fe80::7', PUBLIC_URL: 'https://Grades.College.example:8443/rw', ALLOWED_HOSTS: ' a.example ,b.example:3000,,https://c.example/,[fd00::2]:80' });
    expect([...names].sort()).toEqual(['127.0.0.1', '::1', 'a.example', 'b.example', 'c.example', 'fd00::2', 'fe80::7', 'grades.college.example', 'localhost']);
    for (const wildcard of ['0.0.0.0', '::']) {
      expect([...allowedHostNames({ HOST: wildcard, PUBLIC_URL: undefined, ALLOWED_HOSTS: undefined })].sort()).toEqual(['127.0.0.1', '::1', 'localhost']);
    }
  });
});
