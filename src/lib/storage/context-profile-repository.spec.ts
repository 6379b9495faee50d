import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { BUILT_IN_PROFILES } from '../domain/context-profile';
import { openStorage, databaseOf } from './storage';

describe('context profile repository', () => {
  it('stores an edit over a built-in, revises it, and resets to the default', async () => {
    const storage = await openStorage('capstan-profiles');
    const vehicle = BUILT_IN_PROFILES.find((p) => p.id === 'vehicle-parts')!;
    const { id: _id, ...rest } = vehicle;
    await storage.profiles.save({
      ...rest,
      contextId: 'vehicle-parts',
      levels: { ...vehicle.levels, standard: 1.5 }
    });
    const second = await storage.profiles.save({
      ...rest,
      contextId: 'vehicle-parts',
      levels: { ...vehicle.levels, standard: 1.6 }
    });
    expect(second.rev).toBe(2);
    expect((await storage.profiles.effective()).find((p) => p.id === 'vehicle-parts')?.levels.standard).toBe(
      1.6
    );
    await storage.profiles.reset('vehicle-parts');
    expect((await storage.profiles.effective()).find((p) => p.id === 'vehicle-parts')?.levels.standard).toBe(
      1.33
    );
    await expect(storage.profiles.save({ ...rest, contextId: 'Bad Id' })).rejects.toThrow(
      /lowercase letters/
    );
    storage.close();
    await databaseOf(storage).delete();
  });
});
