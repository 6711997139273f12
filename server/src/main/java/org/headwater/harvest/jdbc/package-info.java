/** Harvesting databases over JDBC; the sources configuration describes them as {@link org.headwater.harvest.jdbc.DatabaseSource}. */
package org.headwater.harvest.jdbc;
