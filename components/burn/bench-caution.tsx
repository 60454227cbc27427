import { Banner } from '../ui/banner';

/** The standing caution on every burn-test screen, in our own words. */
export function BenchCaution() {
  return (
    <Banner
      tone="caution"
      testID="bench-caution"
      message="A bench or field burn test does not replace a standard laboratory test. Local fire codes and the Authority Having Jurisdiction decide what is accepted. Burn only under a hood or in a draft-free enclosure with exhaust, with an extinguisher within reach and a second person present."
    />
  );
}
