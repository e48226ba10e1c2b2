/** Driver files (drivers/*.yaml) and the SCPI instruments they drive. */
package org.lrbench.driver;
