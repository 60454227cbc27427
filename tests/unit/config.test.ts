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

  it('keeps photos on local disk unless an S3 bucket is configured', () => {
    expect(loadConfig({ QB_DATA_DIR: '/srv/qb' }).photos).toEqual({
      kind: 'disk',
      dir: '/srv/qb/photos',
    });
    const s3 = loadConfig({
      QB_S3_BUCKET: 'lab-photos',
      QB_S3_ENDPOINT: 'http://127.0.0.1:9000',
      QB_S3_ACCESS_KEY_ID: 'id',
      QB_S3_SECRET_ACCESS_KEY: 'secret',
    }).photos;
    expect(s3).toEqual({
      kind: 's3',
      bucket: 'lab-photos',
      endpoint: 'http://127.0.0.1:9000',
      region: 'us-east-1',
      accessKeyId: 'id',
      secretAccessKey: 'secret',
      forcePathStyle: true,
    });
  });

  it('refuses an S3 bucket without its keys, naming both variables', () => {
    expect(() => loadConfig({ QB_S3_BUCKET: 'lab-photos' })).toThrow(
      /QB_S3_ACCESS_KEY_ID, QB_S3_SECRET_ACCESS_KEY/,
    );
  });

  it('requires the public URL, the JWT secret and SMTP in production', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(
      /QB_JWT_SECRET[\s\S]*SMTP_HOST[\s\S]*QB_PUBLIC_URL/,
    );
  });
});
