// `run`: one bench plan against a board, headless, for CI. HELLO, the plan through the shared
// link engine, scoring against the reference model, the verdict against the core's limits, the
// capture archive and the session upload. Exit 0 pass, 1 a limit fails, 2 any error.
import { writeFileSync } from 'node:fs';
import type { ByteLink } from '../shared/link-engine/byte-link';
import { confirmOffModel } from '../shared/link-engine/confirm-off-model';
import { LinkEngine, type RunHandle, type RunResult } from '../shared/link-engine/link-engine';
import { DEFAULT_CRC8, type DeviceInfo } from '../shared/link';
import { parseModelConfig, type ModelConfig } from '../shared/numeric';
import { openDevice, type DeviceDeps } from './device';
import type { CliIo } from './io';
import { progressSink } from './progress';
import { parseRunArgs, RUN_HELP, RUN_USAGE, UsageError, type RunOptions } from './run-options';
import { planToRequest, resolvePlan } from './run-plan';
import { labelBytes, MAX_LABEL_BYTES, RunRecording, type RunLabel } from './run-record';
import { humanReport, jsonSummary, type RunReport } from './run-report';
import { scoreRun } from './run-score';
import { fetchCore, packSamples, ServerError, transportOf, type Fetch, type ServerCore } from './run-server';
import { publishRun } from './run-upload';
import { judge, type Limits } from './run-verdict';
import { explainRun } from './run-explain';
import { realClock } from './clock';
import { INTERRUPTED_STATUS, withSigint, type Interrupt } from './interrupt';
import { junitXml } from './junit';
import { runConditions } from './conditions';
import { soakPasses, type SoakRun } from './soak';
import { runVectoring, VectorRunError } from './run-vector';
import type { ModeInfo } from '../shared/link';

/** What `run` touches besides the CLI streams, so tests can swap it. */
export interface RunDeps extends DeviceDeps {
  fetch?: Fetch;
  writeFile?: (path: string, bytes: Uint8Array) => void;
  /** Whether stderr is a terminal (a redrawn bar) or a log (a line a second). */
  stderrIsTty?: boolean;
  /** Ctrl-C; default the process's SIGINT for the length of the run. */
  interrupt?: Interrupt;
}

/** Something went wrong that is not the core's fault: exit status 2 with this one line. */
class RunError extends Error {}

const clock = realClock;

const oneLine = (text: string) => text.replace(/\s*\n\s*/g, ' ').trim();

/**
 * Which core to run: the server's core's mode when --server names one, else --mode, else what the
 * board serves, rotation first when it serves both and the plan reads as a rotating one.
 * @throws RunError when the board lacks the mode asked for, or --mode contradicts the server's core
 */
function chooseMode(o: RunOptions, modes: ModeInfo, core: ServerCore | null): 'rotation' | 'vectoring' {
  const serves = modes.vectoring ? (modes.rotation ? 'rotation and vectoring' : 'vectoring only') : 'rotation only';
  if (core) {
    if (o.mode && o.mode !== core.mode) throw new RunError(`--mode ${o.mode}: core "${core.slug}" on the server is a ${core.mode} core`);
    const served = core.mode === 'vectoring' ? modes.vectoring : modes.rotation;
    const board = core.mode === 'vectoring' ? 'a rotating core' : 'a vectoring core';
    if (!served) throw new RunError(`core "${core.slug}" on the server is a ${core.mode} core, and the device at ${o.device} serves ${board} (${serves}): is the right bitstream loaded, or the right --core named?`);
    return core.mode;
  }
  if (o.mode === 'vectoring' && !modes.vectoring) throw new RunError(`--mode vectoring: the device at ${o.device} serves no vectoring core (${serves}): is the right bitstream loaded?`);
  if (o.mode === 'rotation' && !modes.rotation) throw new RunError(`--mode rotation: the device at ${o.device} serves no rotating core (${serves})`);
  if (o.mode) return o.mode;
  if (modes.rotation && (o.plan || !modes.vectoring)) return 'rotation';
  return 'vectoring';
}

/** The model to score with: the server's core, --config, or the device's INFO with defaults. */
function chooseModel(o: RunOptions, core: (ServerCore & { mode: 'rotation' }) | null, info: DeviceInfo): { model: ModelConfig; from: RunReport['modelFrom'] } {
  let model: ModelConfig;
  let from: RunReport['modelFrom'];
  if (o.config) [model, from] = [parseModelConfig(o.config), 'config'];
  else if (core) [model, from] = [core.model, 'server'];
  else {
    const { angleFormat, angleBits, outBits, outFrac, iterations } = info;
    model = parseModelConfig({ angleFormat, angleBits, outBits, outFrac, iterations, ...(angleFormat === 'rad' ? { angleFrac: info.angleFrac } : {}) });
    from = 'info';
  }
  // The device's formats must be the model's: otherwise every figure would be nonsense.
  const keys: Array<'angleFormat' | 'angleBits' | 'outBits' | 'outFrac' | 'angleFrac'> = ['angleFormat', 'angleBits', 'outBits', 'outFrac'];
  if (info.angleFormat === 'rad') keys.push('angleFrac');
  const differ = keys.filter((k) => model[k] !== info[k]);
  if (differ.length > 0) {
    const what = differ.map((k) => `${k} ${String(info[k])} on the device, ${String(model[k])} in the model`).join('; ');
    throw new RunError(`the device's formats differ from the model of core "${o.core}" (${what}): is the right bitstream loaded?`);
  }
  return { model, from };
}

async function execute(o: RunOptions, io: CliIo, deps: RunDeps): Promise<number> {
  const fetchImpl = deps.fetch ?? fetch;
  const core = o.server ? await fetchCore(fetchImpl, o.server, o.core) : null;
  const limits: Limits = o.limits ?? core?.limits ?? {};
  const limitsFrom: RunReport['limitsFrom'] = o.limits ? 'option' : core ? 'server' : 'none';
  const baud = o.baud ?? core?.baud ?? 3_000_000;
  const crc = o.crc ?? core?.crc ?? DEFAULT_CRC8;

  let link: ByteLink;
  try {
    link = await openDevice(o.device, baud, { ...deps, server: o.server });
  } catch (e) {
    throw new RunError((e as Error).message);
  }
  const t0 = clock.now();
  const recording = new RunRecording(crc);
  const warnings: string[] = [];
  link.onWarning((m) => warnings.push(m));
  try {
    const engine = new LinkEngine({ link, clock, baud, crc, onTraffic: (d, bytes, at) => recording.traffic(d, bytes, at - t0) });
    let info: DeviceInfo;
    try {
      info = await engine.hello();
    } catch (e) {
      throw new RunError(`the device at ${o.device} did not answer HELLO (${(e as Error).message}): check the baud rate, the CRC and that the bitstream is loaded`);
    }
    let modes: ModeInfo;
    try {
      modes = await engine.modes();
    } catch (e) {
      throw new RunError(`the device at ${o.device} reports version ${info.version} but did not answer MODES (${(e as Error).message})`);
    }
    if (chooseMode(o, modes, core) === 'vectoring') {
      return await runVectoring({
        o, io, engine, info, modes, recording, limits, limitsFrom, baud, crc, t0, warnings, fetchImpl, core: core?.mode === 'vectoring' ? core : null,
        stderrIsTty: deps.stderrIsTty ?? false, writeFile: deps.writeFile, interrupt: deps.interrupt,
      });
    }
    if (!o.plan) throw new UsageError(`--plan ${o.planText} is a vectoring core's plan, and the board serves a rotating core`);
    if (o.vectorConfig && !o.config) throw new UsageError('--config holds a vectoring core\'s keys, and the board serves a rotating core');
    const { model, from } = chooseModel(o, core?.mode === 'rotation' ? core : null, info);
    const plan = resolvePlan(o.plan, model, io.readFile);
    const label: RunLabel = { recordedBy: 'anglebench run', core: o.core, build: o.build, board: o.board, plan, model };
    if (o.out && labelBytes(label) > MAX_LABEL_BYTES) throw new UsageError(`--plan file: too many codes to record in the archive's label (${labelBytes(label)} bytes, at most ${MAX_LABEL_BYTES})`);
    recording.start(label);
    const request = planToRequest(plan, model);
    const progress = progressSink(io.stderr, deps.stderrIsTty ?? false, () => clock.now());
    const startedAt = new Date();
    const { conditions, fromBoard } = runConditions(info, o.conditions);
    let result: RunResult;
    let soak: SoakRun | null = null;
    let current: RunHandle | null = null;
    const stopOnInterrupt = deps.interrupt?.onRequest(() => void current?.abort()) ?? (() => undefined);
    // A run (or soak pass) that starts after the interrupt came is aborted as it begins.
    const started = (h: RunHandle): RunHandle => {
      current = h;
      if (deps.interrupt?.requested) void h.abort();
      return h;
    };
    try {
      if (o.soak) {
        const keepGoing = () => !deps.interrupt?.requested;
        soak = await soakPasses({ engine, request, model, spec: o.soak, clock, confirm: confirmOffModel(model), log: io.stderr, onPassStart: started, keepGoing });
        result = soak.status === 'complete' ? soak.result : { ...soak.result, status: soak.status, message: soak.message };
      } else {
        result = await started(engine.run(request, { onProgress: (p) => progress.update(p), confirm: confirmOffModel(model) })).done;
      }
    } finally {
      stopOnInterrupt();
      progress.end(null);
    }
    const endedAt = new Date();
    if (result.status === 'failed') throw new RunError(result.message ?? 'the run failed');
    const archive = recording.finish(clock.now() - t0);
    if (o.out) {
      try {
        (deps.writeFile ?? writeFileSync)(o.out, archive);
      } catch (e) {
        throw new RunError(`cannot write the archive to ${o.out}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
      }
    }
    const score = scoreRun(model, plan, result, result.figures.checkFailures);
    const verdict = judge(score, limits, soak ? { unstableCodes: soak.record.unstable.count } : {});
    const report: RunReport = {
      core: o.core, build: o.build, board: o.board, device: o.device, baud, info, plan, planText: o.planText, model, modelFrom: from,
      limitsFrom, status: result.status, elapsedMs: result.elapsedMs, score, figures: result.figures, verdict, archive: o.out,
      conditions, conditionsFromBoard: fromBoard, soak: soak?.record ?? null,
      explanation: o.explain ? explainRun(model, result) : undefined,
    };
    for (const w of warnings.slice(0, 5)) io.stderr(`warning: ${w}\n`);
    if (deps.interrupt?.requested) {
      // What was captured is on record (--out); a partial session is not uploaded.
      io.stdout(o.json ? JSON.stringify(jsonSummary(report, null), null, 2) + '\n' : humanReport(report));
      io.stderr(`interrupted: ${score.answered} of ${score.total} codes answered${o.out ? `, the capture written to ${o.out}` : ''}; nothing uploaded\n`);
      return INTERRUPTED_STATUS;
    }
    await publishRun({
      o, io, fetchImpl, core, writeFile: deps.writeFile,
      human: humanReport(report),
      json: (upload) => jsonSummary(report, upload),
      junit: (sessionUrl) => junitXml(report, sessionUrl),
      upload: () => {
        const summary = jsonSummary(report, null);
        return {
          session: {
            coreId: core!.id, coreSlug: core!.slug, build: o.build, board: o.board, plan, startedAt: startedAt.toISOString(), endedAt: endedAt.toISOString(),
            transport: transportOf(o, baud, crc),
            deviceInfo: info, stats: summary.stats, link: result.figures, verdict: summary.verdict, passed: verdict.passed, sampleCount: score.answered,
            ...soakUpload(conditions, soak),
          },
          samples: packSamples(result.codes, result.cos, result.sin, result.answered),
          archive,
        };
      },
    });
    return verdict.passed ? 0 : 1;
  } finally {
    await link.close().catch(() => undefined);
  }
}

/** The session's conditions and soak, left out when there are none (older servers refuse unknown keys). */
function soakUpload(conditions: RunReport['conditions'], soak: SoakRun | null): Record<string, unknown> {
  return { ...(Object.keys(conditions).length > 0 ? { conditions } : {}), ...(soak ? { soak: soak.record } : {}) };
}

/** The `run` command. */
export async function runRunCommand(argv: string[], io: CliIo, deps: RunDeps = { stderrIsTty: process.stderr.isTTY === true }): Promise<number> {
  try {
    const o = parseRunArgs(argv);
    if (o.help) {
      io.stdout(RUN_HELP);
      return 0;
    }
    if (deps.interrupt) return await execute(o, io, deps);
    return await withSigint(io, (interrupt) => execute(o, io, { ...deps, interrupt }));
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr(`error: ${oneLine(e.message)}\n${RUN_USAGE}\n`);
      return 2;
    }
    if (e instanceof RunError || e instanceof ServerError || e instanceof VectorRunError) {
      io.stderr(`error: ${oneLine(e.message)}\n`);
      return 2;
    }
    io.stderr(`error: ${oneLine(e instanceof Error ? e.message : String(e))}\n`);
    return 2;
  }
}
