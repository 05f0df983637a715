/**
 * Reading and writing NumPy {@code .npy} arrays and {@code .npz} archives, written from the published
 * NumPy file format; used by the region-graph converter for parameter tensors and their export.
 */
package dev.circa.converter.npz;
