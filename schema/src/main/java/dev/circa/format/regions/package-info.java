/**
 * Region graph documents ({@code "format": "circa.regions"}, FORMAT.md section 3): the model, its
 * streaming reader and its canonical writer. The converter compiles these graphs into circuits.
 */
package dev.circa.format.regions;
