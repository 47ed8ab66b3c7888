import { describe, expect, it } from 'vitest';
import { OutboxController } from './outbox.controller.js';
import { OutboxModule } from './outbox.module.js';

describe('the Outbox exists only outside production', () => {
  it('has its route in development and tests', () => {
    expect(OutboxModule.forEnvironment('development').controllers).toEqual([OutboxController]);
    expect(OutboxModule.forEnvironment('test').controllers).toEqual([OutboxController]);
  });
  it('has no route at all in production', () => {
    expect(OutboxModule.forEnvironment('production').controllers).toBeUndefined();
  });
});
