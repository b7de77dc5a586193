// The mail a core's watchers get when a stored session regresses against its core's baseline.
import type { Mailer } from '../mail/mailer';
import { sendRegressionMail } from '../mail/messages';
import { BenchSession, Build, Core, CoreWatcher, User } from '../db/models';
import { mailSafely } from '../mail/safely';

/** Tell the core's enabled watchers which limits `row` failed; `origin` is where links point. */
export async function mailRegression(mailer: Mailer, origin: string, row: BenchSession, core: Core, failedLimits: string[]): Promise<void> {
  const watchers = await CoreWatcher.findAll({ where: { coreId: core.id } });
  const users = watchers.length ? await User.findAll({ where: { id: watchers.map((w) => w.userId), disabled: false } }) : [];
  if (!users.length) return;
  const build = row.buildId ? await Build.findByPk(row.buildId) : null;
  await mailSafely(() =>
    sendRegressionMail(mailer, users.map((u) => u.email), {
      core: core.name,
      build: build?.label ?? 'unknown',
      sessionId: row.id,
      failedLimits,
      link: `${origin}/sessions/${row.id}`,
    }),
  );
}
