import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { BenchController, BenchSnapshot } from '../live/bench-controller';
import { COMMON_BAUD_RATES, MAX_BAUD, MIN_BAUD, recommendedBufferSize, type SerialSettings } from '../transport/serial-options';
import { browserFacts, hostedBoardCore, hostedBoardUrl, hostedBoardUrlFor, serialSupport } from '../transport/browser-links';
import { WebSerialLink } from '../transport/web-serial-link';
import { SocketLink } from '../transport/socket-link';
import { openStationLink } from '../transport/station-link';
import { StationPicker } from './station-picker';
import { queryClient } from '../../../lib/query-client';
import { stationKeys, type StationListing } from '../../../lib/resources/stations';
import { coresQueryOptions, useCores } from '../../../lib/resources/cores';
import { SerialCaution, serialCautionSeen } from './serial-caution';
import { btn, btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';

const wsUrl = z.string().trim().regex(/^wss?:\/\/\S+$/, 'A ws:// or wss:// address');

const connectSchema = z
  .object({
    transport: z.enum(['simulated', 'bridge', 'serial', 'station']),
    station: z.string().nullish(),
    simulatedUrl: z.string(),
    bridgeUrl: z.string(),
    bridgeToken: z.string().trim().max(500),
    baud: z.string(),
    customBaud: z.string(),
    dataBits: z.enum(['7', '8']),
    parity: z.enum(['none', 'even', 'odd']),
    stopBits: z.enum(['1', '2']),
    flowControl: z.enum(['none', 'hardware']),
    bufferSize: z.coerce.number<string>().int('A whole number of bytes').min(256, 'At least 256 bytes').max(16 * 1024 * 1024, 'At most 16 MiB'),
    dtr: z.boolean(),
    rts: z.boolean(),
    reuseGranted: z.boolean(),
  })
  .superRefine((v, ctx) => {
    const url = v.transport === 'simulated' ? ['simulatedUrl', v.simulatedUrl] : v.transport === 'bridge' ? ['bridgeUrl', v.bridgeUrl] : null;
    if (url && !wsUrl.safeParse(url[1]).success) ctx.addIssue({ code: 'custom', path: [url[0]], message: 'Enter a ws:// or wss:// address' });
    if (v.transport === 'station' && !v.station) ctx.addIssue({ code: 'custom', path: ['station'], message: 'Choose a free station' });
    if (v.transport === 'serial' && v.baud === 'custom') {
      const b = Number(v.customBaud);
      if (!Number.isInteger(b) || b < MIN_BAUD || b > MAX_BAUD) ctx.addIssue({ code: 'custom', path: ['customBaud'], message: `A whole rate from ${MIN_BAUD.toLocaleString()} to ${MAX_BAUD.toLocaleString()}` });
    }
  });
type ConnectForm = z.input<typeof connectSchema>;

const baudOf = (v: { baud: string; customBaud: string }) => (v.baud === 'custom' ? Number(v.customBaud) : Number(v.baud));

export function ConnectPanel({ controller, snap }: { controller: BenchController; snap: BenchSnapshot }) {
  const serial = serialSupport(browserFacts());
  const [caution, setCaution] = useState<ConnectForm | null>(null);
  const { register, handleSubmit, watch, setValue, formState } = useForm<ConnectForm, unknown, z.output<typeof connectSchema>>({
    resolver: zodResolver(connectSchema),
    defaultValues: {
      transport: 'simulated',
      // A board of its own on the server this page came from (same origin: no CSP exception).
      simulatedUrl: hostedBoardUrl(window.location),
      bridgeUrl: 'ws://127.0.0.1:5176/',
      bridgeToken: '',
      baud: '3000000',
      customBaud: '',
      dataBits: '8',
      parity: 'none',
      stopBits: '1',
      flowControl: 'none',
      bufferSize: String(recommendedBufferSize(3_000_000)),
      dtr: true,
      rts: false,
      reuseGranted: false,
    },
  });
  const { errors } = formState;
  const transport = watch('transport');
  const baud = watch('baud');
  const busy = snap.status === 'connecting' || snap.status === 'connected';

  const resizeBuffer = (v: { baud: string; customBaud: string }) => {
    const b = baudOf(v);
    if (Number.isInteger(b) && b >= MIN_BAUD) setValue('bufferSize', String(recommendedBufferSize(b)));
  };

  const connect = async (v: z.output<typeof connectSchema>) => {
    if (v.transport === 'simulated') {
      // A hosted board for a core speaks that core's link profile (CRC and baud): the page talks the same.
      const address = v.simulatedUrl.trim();
      const named = hostedBoardCore(address);
      const core = named.core ? (await queryClient.fetchQuery(coresQueryOptions()).catch(() => [])).find((c) => c.slug === named.core || String(c.id) === named.core) : undefined;
      const baud = named.baud ?? core?.linkProfile.baud ?? 3_000_000;
      return controller.connect(() => SocketLink.open(address), `Simulated board ${address}`, baud, core?.linkProfile.crc);
    }
    if (v.transport === 'station' && v.station) {
      const station = queryClient.getQueryData<StationListing[]>(stationKeys.list())?.find((s) => s.name === v.station);
      return controller.connect(() => openStationLink(v.station!), `Station ${v.station}`, station?.baud ?? 3_000_000);
    }
    if (v.transport === 'bridge') {
      const url = new URL(v.bridgeUrl.trim());
      if (v.bridgeToken) url.searchParams.set('token', v.bridgeToken);
      return controller.connect(() => SocketLink.open(url.toString()), `Bench bridge ${v.bridgeUrl}`, 3_000_000);
    }
    const settings: SerialSettings = {
      baudRate: baudOf(v),
      dataBits: Number(v.dataBits) as 7 | 8,
      parity: v.parity,
      stopBits: Number(v.stopBits) as 1 | 2,
      flowControl: v.flowControl,
      bufferSize: v.bufferSize,
      dataTerminalReady: v.dtr,
      requestToSend: v.rts,
    };
    return controller.connect(
      async () => {
        const granted = v.reuseGranted ? (await navigator.serial.getPorts())[0] : undefined;
        const port = granted ?? (await navigator.serial.requestPort());
        return WebSerialLink.open(port, settings);
      },
      `Serial port at ${settings.baudRate.toLocaleString()} baud`,
      settings.baudRate,
    );
  };

  const onValid = (v: z.output<typeof connectSchema>) => {
    if (v.transport === 'serial' && !serialCautionSeen()) setCaution(v as unknown as ConnectForm);
    else void connect(v);
  };

  return (
    <section aria-labelledby="connect-title" className={panel}>
      <h2 id="connect-title" className={panelTitle}>
        Link
      </h2>
      {snap.status === 'connected' ? (
        <div className="grid gap-3">
          <p className="text-sm">
            <span className="font-bold text-pass">Connected</span> · {snap.transportLabel}
          </p>
          {snap.info && <DeviceInfoTable info={snap.info} modes={snap.modes} />}
          <button type="button" className={btn} onClick={() => void controller.disconnect()}>
            Disconnect
          </button>
        </div>
      ) : (
        <form noValidate onSubmit={handleSubmit(onValid)} className="grid gap-3">
          <fieldset className="grid gap-1.5 text-sm" disabled={busy}>
            <legend className="mb-1 font-bold">Connect through</legend>
            <label className="flex items-center gap-2">
              <input type="radio" value="simulated" {...register('transport')} /> Simulated board (on this server)
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" value="station" {...register('transport')} /> Station (a board on a lab PC, through this server)
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" value="bridge" {...register('transport')} /> Bench bridge (network)
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" value="serial" disabled={!serial.available} aria-describedby={serial.available ? undefined : 'serial-unavailable'} {...register('transport')} /> Serial port in this browser
            </label>
            {!serial.available && (
              <p id="serial-unavailable" data-testid="serial-unavailable" className="text-xs text-ink-soft">
                {serial.reason}
              </p>
            )}
          </fieldset>

          {transport === 'simulated' && <HostedCorePicker onPick={(slug) => setValue('simulatedUrl', hostedBoardUrlFor(window.location, slug))} />}
          {transport === 'simulated' && (
            <label className={label}>
              Board address
              <input className={`${input} font-mono`} {...register('simulatedUrl')} />
              {errors.simulatedUrl && <span className={fieldError}>{errors.simulatedUrl.message}</span>}
            </label>
          )}
          {transport === 'station' && <StationPicker reg={register('station')} error={errors.station?.message} />}
          {transport === 'bridge' && (
            <>
              <label className={label}>
                Bridge address
                <input className={`${input} font-mono`} {...register('bridgeUrl')} />
                {errors.bridgeUrl && <span className={fieldError}>{errors.bridgeUrl.message}</span>}
              </label>
              <label className={label}>
                Bridge token
                <input type="password" autoComplete="off" className={`${input} font-mono`} {...register('bridgeToken')} />
              </label>
            </>
          )}
          {transport === 'serial' && (
            <div className="grid grid-cols-2 gap-2">
              <label className={label}>
                Baud
                <select className={input} {...register('baud', { onChange: (e) => resizeBuffer({ baud: e.target.value, customBaud: watch('customBaud') }) })}>
                  {COMMON_BAUD_RATES.map((b) => (
                    <option key={b} value={b}>
                      {b.toLocaleString()}
                    </option>
                  ))}
                  <option value="custom">Other…</option>
                </select>
              </label>
              {baud === 'custom' ? (
                <label className={label}>
                  Other rate
                  <input inputMode="numeric" className={`${input} font-mono`} {...register('customBaud', { onChange: (e) => resizeBuffer({ baud: 'custom', customBaud: e.target.value }) })} />
                  {errors.customBaud && <span className={fieldError}>{errors.customBaud.message}</span>}
                </label>
              ) : (
                <span />
              )}
              <Select label="Data bits" options={['8', '7']} reg={register('dataBits')} />
              <Select label="Parity" options={['none', 'even', 'odd']} reg={register('parity')} />
              <Select label="Stop bits" options={['1', '2']} reg={register('stopBits')} />
              <Select label="Flow control" options={['none', 'hardware']} reg={register('flowControl')} />
              <label className={`${label} col-span-2`}>
                Receive buffer, bytes (sized for 20 ms at this rate)
                <input inputMode="numeric" className={`${input} font-mono`} {...register('bufferSize')} />
                {errors.bufferSize && <span className={fieldError}>{errors.bufferSize.message}</span>}
              </label>
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" {...register('dtr')} /> DTR
              </label>
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" {...register('rts')} /> RTS
              </label>
              <label className="col-span-2 flex items-center gap-2 text-sm">
                <input type="checkbox" {...register('reuseGranted')} /> Reuse the port granted before
              </label>
            </div>
          )}
          {snap.linkMessage && (
            <p role="alert" className="rounded border border-fail bg-fail-soft px-2 py-1.5 text-sm text-fail">
              {snap.linkMessage}
            </p>
          )}
          <button type="submit" className={btnPrimary} disabled={busy}>
            {snap.status === 'connecting' ? 'Connecting…' : 'Connect'}
          </button>
        </form>
      )}
      {caution && (
        <SerialCaution
          onCancel={() => setCaution(null)}
          onGoOn={() => {
            const v = connectSchema.parse(caution);
            setCaution(null);
            void connect(v);
          }}
        />
      )}
    </section>
  );
}

/** Which core the server's simulated board plays: its mode, configuration and link profile (`?core=` of the address). */
function HostedCorePicker({ onPick }: { onPick: (slug: string | null) => void }) {
  const cores = useCores();
  return (
    <label className={label}>
      Core on the simulated board
      <select className={input} defaultValue="" onChange={(e) => onPick(e.target.value || null)}>
        <option value="">Default rotating core</option>
        {(cores.data ?? []).map((c) => (
          <option key={c.id} value={c.slug}>
            {c.slug} ({c.mode === 'vectoring' ? 'vectoring' : 'rotation'})
          </option>
        ))}
      </select>
    </label>
  );
}

function Select({ label: text, options, reg }: { label: string; options: string[]; reg: ReturnType<ReturnType<typeof useForm<ConnectForm>>['register']> }) {
  return (
    <label className={label}>
      {text}
      <select className={input} {...reg}>
        {options.map((o) => (
          <option key={o}>{o}</option>
        ))}
      </select>
    </label>
  );
}

function DeviceInfoTable({ info, modes }: { info: NonNullable<BenchSnapshot['info']>; modes: BenchSnapshot['modes'] }) {
  const v = modes?.vectoring;
  // A board that only vectors has no rotating core for INFO's formats to describe.
  const rotates = modes?.rotation !== false;
  const rows: [string, string][] = [
    ['Device', info.name || '—'],
    ...(rotates
      ? ([
          ['Angle', `${info.angleFormat}, ${info.angleBits} bit${info.angleFormat === 'rad' ? `, ${info.angleFrac} frac` : ''}`],
          ['Output', `${info.outBits} bit, ${info.outFrac} frac`],
          ['Iterations', String(info.iterations)],
        ] as [string, string][])
      : []),
    ...(v
      ? ([
          ['Vectoring x, y', `${v.inBits} bit, ${v.inFrac} frac`],
          ['atan2 out', `${v.angleFormat}, ${v.angleBits} bit${v.angleFormat === 'rad' ? `, ${v.angleFrac} frac` : ''}`],
          ['Magnitude out', `${v.magBits} bit, ${v.magFrac} frac`],
          ['Vectoring iterations', String(v.iterations)],
        ] as [string, string][])
      : []),
    ['Queue depth', String(info.queueDepth)],
    ['Build', `0x${info.buildId.toString(16).padStart(8, '0')}`],
    ['Clock', `${(info.clockKHz / 1000).toLocaleString()} MHz`],
  ];
  return (
    <dl data-testid="device-info" className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="font-mono">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
