// The YAML settings file against its schema: the shipped file says its values are the defaults, and
// a bad chat setting stops start-up with the key and the reason.
import { describe, expect, it } from 'vitest';
import { DEFAULT_CONFIG_FILE, loadAppConfig, parseAppConfig } from '../../src/config/appConfig.ts';

describe('app config', () => {
  it('ships a config/lapsewatch.yaml whose values are the defaults, chat.answersAtOnce among them', () => {
    const shipped = loadAppConfig(DEFAULT_CONFIG_FILE, {});
    const defaults = parseAppConfig({}, 'defaults');
    expect(shipped.ok && defaults.ok).toBe(true);
    if (!shipped.ok || !defaults.ok) return;
    expect(shipped.config).toEqual(defaults.config);
    expect(shipped.config.chat.answersAtOnce).toBe(6);
  });

  it('refuses answers at once that are not a whole number from 1 to 64, naming the key', () => {
    for (const answersAtOnce of [0, 2.5, 65, '6']) {
      const result = parseAppConfig({ chat: { answersAtOnce } }, 'lapsewatch.yaml');
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.error).toMatch(/^lapsewatch\.yaml: key "chat\.answersAtOnce": /);
    }
    const raised = parseAppConfig({ chat: { answersAtOnce: 16 } }, 'lapsewatch.yaml');
    expect(raised.ok && raised.config.chat.answersAtOnce).toBe(16);
  });
});
