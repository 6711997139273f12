/**
 * Who owns what: the workspace's owners file ({@link org.headwater.owners.OwnersFile}, read at every
 * harvest and turned into observations by {@link org.headwater.owners.FileOwners}), and assignments by
 * hand ({@link org.headwater.owners.ManualOwners}), which win over the file's rules for their dataset.
 */
package org.headwater.owners;
