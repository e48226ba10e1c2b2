/** Lot reports people read: one self-contained HTML file with embedded plots. */
package org.lrbench.report;
