import { stampNew, type WriteContext } from '../../src/lib/domain/record-meta';
import { changeSetOf, encodeExchangeFile } from '../../src/lib/exchange/exchange-file';

/**
 * A valid exchange file whose every name carries markup that would create elements or run code if any part of
 * the app rendered it as HTML (invented data: a fictional foundry): plain tags, event handlers, a script, the
 * slash-separated `<img/src=x/onerror=…>` and an entity-written `javascript:` link. The reader does not screen
 * text for markup (no screen is complete); the test proves none of it ever becomes an element or runs.
 */
export async function buildMarkupFile(): Promise<Uint8Array> {
  let n = 0;
  const ctx: WriteContext = {
    deviceId: 'markup-device',
    now: () => new Date('2026-11-20T10:00:00.000Z'),
    newId: () => `00000000-0000-4000-8000-${String(++n).padStart(12, '0')}`
  };
  const site = stampNew(
    {
      name: '<b id="x-site">Bold</b> Works<script id="x-script">document.body.dataset.pwned = "1"</script>',
      region: '<img src=x id="x-img" onerror="document.body.dataset.pwned = 1">',
      timeZone: 'UTC'
    },
    ctx
  );
  const process = stampNew(
    {
      siteId: site.id,
      name: '"><b id="x-proc">Casting',
      owner: '<img/src=x/id=x-img2/onerror=document.body.dataset.pwned=1>',
      contextId: 'vehicle-parts',
      monthlyVolume: 2000,
      costPerDefective: 9,
      currency: 'EUR'
    },
    ctx
  );
  const characteristic = stampNew(
    {
      processId: process.id,
      name: '<i id="x-ch">Bore</i>',
      unit: '<u id="x-unit">mm</u>',
      dataKind: 'measured' as const,
      lsl: 9.9,
      usl: 10.1,
      riskClass: 'key' as const
    },
    ctx
  );
  let seed = 7;
  const next = () => ((seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5) * 0.12;
  const studies = Array.from({ length: 11 }, (_, m) =>
    stampNew(
      {
        characteristicId: characteristic.id,
        period: `2026-${String(m + 1).padStart(2, '0')}`,
        data: {
          kind: 'raw' as const,
          values: Array.from({ length: 30 }, () => Math.round((10 + next()) * 1000) / 1000)
        },
        enteredBy: '<b>lead</b>',
        note: '<a id="x-note" href="&#106;avascript:document.body.dataset.pwned=1">note</a>'
      },
      ctx
    )
  );
  const project = stampNew(
    {
      processId: process.id,
      title: '<em id="x-proj">Fix</em> the bore',
      phase: 'Measure' as const,
      owner: '<b>o</b>',
      startDate: '2026-09-01',
      expectedAnnualSaving: 5000
    },
    ctx
  );
  const changeSet = changeSetOf(
    {
      appVersion: 'test',
      exportedBy: { deviceId: 'markup-device', deviceName: '<b id="x-device">Foundry</b>' },
      exportedAt: '2026-11-20T10:00:00.000Z',
      scope: { kind: 'everything' }
    },
    {
      contextProfiles: [],
      sites: [site],
      processes: [process],
      characteristics: [characteristic],
      studies,
      projects: [project],
      reviews: []
    }
  );
  return encodeExchangeFile(changeSet);
}
