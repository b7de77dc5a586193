/** Send mail after the change is committed; a mail failure is logged, it does not undo the change. */
export async function mailSafely(send: () => Promise<void>): Promise<boolean> {
  try {
    await send();
    return true;
  } catch (err) {
    console.error('mail not sent:', (err as Error).message);
    return false;
  }
}
