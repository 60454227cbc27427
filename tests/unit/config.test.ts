import { loadConfig } from '../../server/config';

describe('loadConfig', () => {
  it('defaults to one server on 127.0.0.1:8080 and the private cluster', () => {
    const config = loadConfig({});
    expect(config).toMatchObject({
      env: 'development',
      host: '127.0.0.1',
      port: 8080,
      databaseUrl: undefined,
    });
    expect(config.pgPort).not.toBe(config.pgTestPort);
  });

  it('reads the port and an external database from the environment', () => {
    const config = loadConfig({ PORT: '9090', DATABASE_URL: 'postgres://u:p@db.internal:5432/qb' });
    expect(config.port).toBe(9090);
    expect(config.databaseUrl).toBe('postgres://u:p@db.internal:5432/qb');
  });

  it('fails fast naming each bad variable', () => {
    expect(() => loadConfig({ PORT: 'eighty', DATABASE_URL: 'mysql://x' })).toThrow(
      /PORT[\s\S]*DATABASE_URL/,
    );
  });

  it('does not log requests in tests unless asked to', () => {
    expect(loadConfig({ NODE_ENV: 'test' }).logRequests).toBe(false);
    expect(loadConfig({ NODE_ENV: 'test', QB_LOG_REQUESTS: '1' }).logRequests).toBe(true);
  });
});
