import { createTestApp, type TestApp } from './test-app.js';

/** Creates an app with these settings in the environment (its configuration is read while it is built). */
export async function appWith(env: Record<string, string>, reset: boolean): Promise<TestApp> {
  const saved = Object.fromEntries(Object.keys(env).map((key) => [key, process.env[key]]));
  Object.assign(process.env, env);
  try {
    return await createTestApp({ reset });
  } finally {
    for (const [key, value] of Object.entries(saved)) {
      if (value === undefined) delete process.env[key];
      else process.env[key] = value;
    }
  }
}
