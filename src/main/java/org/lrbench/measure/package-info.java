/** Running a sweep on instruments: time base, settling, auto-ranging, per-point extraction. */
package org.lrbench.measure;
