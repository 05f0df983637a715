/**
 * Reading and writing circa documents: the streaming circuit reader and writer, named read limits,
 * located format errors and all-or-nothing output files. Used by every module that touches a file.
 */
package dev.circa.format.io;
