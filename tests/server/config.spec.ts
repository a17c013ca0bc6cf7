import { readConfig } from '../../server/config.js';

describe('readConfig', () => {
  it('should default to loopback on port 3000', () => {
    const config = readConfig({});

    expect(config.host).toBe('127.0.0.1');
    expect(config.port).toBe(3000);
    expect(config.production).toBeFalse();
  });

  it('should take PORT and DATABASE_URL from the environment', () => {
    const config = readConfig({ PORT: '8080', DATABASE_URL: 'postgres://someone@db.internal/bench' });

    expect(config.port).toBe(8080);
    expect(config.databaseUrl).toBe('postgres://someone@db.internal/bench');
  });

  it('should refuse a PORT that is not a port number', () => {
    expect(() => readConfig({ PORT: 'eighty' })).toThrowError(/PORT must be a whole number/);
  });
});
