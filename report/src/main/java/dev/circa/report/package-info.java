/**
 * The model report: one self-contained HTML page (inline SVG plots and CSS, nothing fetched) that a reviewer
 * reads before signing a model off; used by {@code circa report} and {@code circa demo}.
 */
package dev.circa.report;
