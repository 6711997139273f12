/**
 * Owns the abstract values a script's expressions evaluate to without running it: known text,
 * path templates with holes for loop variables, lists, module names, tracked objects, choices
 * between branches, and unknowns that remember why. Both language evaluators speak these values.
 */
package org.headwater.analysis.script.value;
