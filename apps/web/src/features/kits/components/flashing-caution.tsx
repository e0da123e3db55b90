import { Banner } from '../../../components/ui/banner';

/** The usual cautions wherever the UI talks about flashing with a rented kit. */
export function FlashingCaution() {
  return (
    <Banner tone="warn" title="Before you flash">
      Flash with the battery supporter connected, ignition on and engine off, and never interrupt a write. Drive logged
      pulls only on closed roads or a dyno, obey the law and keep your eyes on the road; follow local rules and defer to
      licensed professionals.
    </Banner>
  );
}
