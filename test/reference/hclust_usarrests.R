# Reference for agglomerate(): R's hclust / cutree / cophenetic on the US arrests by state data
# (McNeill 1977, as R ships it in datasets::USArrests). Run: Rscript test/reference/hclust_usarrests.R
# Centroid and median are run on SQUARED Euclidean distances, as R's documentation asks; their
# heights (and cophenetic values) are then squared distances, so the square roots are stored.
x <- as.matrix(datasets::USArrests)
d <- dist(x)
methods <- list(
  single = list(r = "single", squared = FALSE),
  complete = list(r = "complete", squared = FALSE),
  average = list(r = "average", squared = FALSE),
  weighted = list(r = "mcquitty", squared = FALSE),
  centroid = list(r = "centroid", squared = TRUE),
  median = list(r = "median", squared = TRUE),
  ward = list(r = "ward.D2", squared = FALSE)
)
num <- function(v) paste0("[", paste(sprintf("%.17g", v), collapse = ","), "]")
int <- function(v) paste0("[", paste(as.integer(v), collapse = ","), "]")
str <- function(v) paste0("[", paste0('"', v, '"', collapse = ","), "]")
parts <- c()
for (name in names(methods)) {
  m <- methods[[name]]
  h <- if (m$squared) hclust(d^2, m$r) else hclust(d, m$r)
  heights <- if (m$squared) sqrt(h$height) else h$height
  coph <- if (m$squared) sqrt(cophenetic(h)) else cophenetic(h)
  parts <- c(parts, sprintf(
    '"%s":{"rMethod":"%s","onSquared":%s,"heightsInMergeOrder":%s,"heightsSorted":%s,"cutree4":%s,"copheneticCorrelation":%.17g}',
    name, m$r, tolower(as.character(m$squared)), num(heights), num(sort(heights)), int(cutree(h, 4)),
    cor(as.vector(coph), as.vector(d))))
}
rows <- paste0("[", paste(apply(x, 1, num), collapse = ","), "]")
json <- sprintf(
  '{"producedBy":"%s, stats::hclust, cutree, cophenetic","source":"US arrests by state, McNeill (1977), as shipped in R datasets::USArrests","columns":%s,"labels":%s,"rows":%s,"methods":{%s}}',
  R.version.string, str(colnames(x)), str(rownames(x)), rows, paste(parts, collapse = ","))
here <- dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE)))
writeLines(json, file.path(here, "fixtures", "hclust_usarrests.json"))
