/**
 * Lot sampling after ISO 2859-1: single sampling plans (Table I and Table II-A for normal
 * inspection, built in; Tables II-B and II-C for tightened and reduced inspection from the lab's
 * transcription), each class's plan for a lot size, the lot's disposition, and the switching rules
 * of clause 9 as a fold over a supplier's scheme history.
 */
package org.lrbench.sampling;
