/**
 * A lot from start to end, in one place: {@link org.lrbench.lot.LotStart} validates a lot run's
 * request, gates it on the bench's check standard, loads the bench's corrections once, fixes the
 * plan's identity and the supplier's scheme and checks it against the store before any instrument
 * is touched; {@link org.lrbench.lot.LotRunner} measures the sample part by part from a
 * {@link org.lrbench.lot.PartFeeder}; {@link org.lrbench.lot.LotEnd} writes the lot's summary.
 * The command line, the demo and the bench service all start a lot here and nowhere else.
 */
package org.lrbench.lot;
