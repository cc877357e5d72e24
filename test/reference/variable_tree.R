# Reference for variableTree(): R's cor / hclust / cutree on hierarchies of the COLUMNS of open
# datasets that R ships (datasets::mtcars, Henderson & Velleman 1981; datasets::swiss, Mosteller &
# Tukey 1977; datasets::longley, Longley 1967). Dissimilarity 1 - r^2 (squared) or 1 - |r|
# (absolute), r Pearson or Spearman (average ranks for ties, as cor() does).
# Run: Rscript test/reference/variable_tree.R
datasets <- list(mtcars = datasets::mtcars, swiss = datasets::swiss, longley = datasets::longley)
choices <- list(
  list(similarity = "pearson", strength = "squared", method = "average", r = "average"),
  list(similarity = "pearson", strength = "absolute", method = "average", r = "average"),
  list(similarity = "spearman", strength = "squared", method = "complete", r = "complete"),
  list(similarity = "spearman", strength = "absolute", method = "single", r = "single"),
  list(similarity = "pearson", strength = "squared", method = "weighted", r = "mcquitty"),
  list(similarity = "pearson", strength = "absolute", method = "complete", r = "complete")
)
num <- function(v) paste0("[", paste(sprintf("%.17g", v), collapse = ","), "]")
int <- function(v) paste0("[", paste(as.integer(v), collapse = ","), "]")
str <- function(v) paste0("[", paste0('"', v, '"', collapse = ","), "]")
sets <- c()
for (name in names(datasets)) {
  x <- as.matrix(datasets[[name]])
  runs <- c()
  for (ch in choices) {
    r <- cor(x, method = ch$similarity)
    d <- if (ch$strength == "squared") 1 - r^2 else 1 - abs(r)
    h <- hclust(as.dist(d), ch$r)
    cuts <- sapply(2:(ncol(x) - 1), function(k) int(cutree(h, k)))
    runs <- c(runs, sprintf(
      '{"similarity":"%s","strength":"%s","method":"%s","rMethod":"%s","call":"hclust(as.dist(%s), \\"%s\\")","heightsSorted":%s,"cuts":[%s]}',
      ch$similarity, ch$strength, ch$method, ch$r,
      if (ch$strength == "squared") sprintf("1 - cor(X, method = \\\"%s\\\")^2", ch$similarity) else sprintf("1 - abs(cor(X, method = \\\"%s\\\"))", ch$similarity),
      ch$r, num(sort(h$height)), paste(cuts, collapse = ",")))
  }
  # Group summaries of the default tree cut into 3: first principal component of each group's
  # standardised columns (stats::prcomp, scale. = TRUE), its share of the group's variance, and for
  # every column R2 with its own group's component, the largest R2 with another group's, their 1 - R2 ratio.
  h <- hclust(as.dist(1 - cor(x)^2), "average")
  g <- cutree(h, 3)
  scores <- lapply(1:3, function(k) {
    cols <- which(g == k)
    if (length(cols) == 1) return(list(score = x[, cols], share = 1))
    p <- prcomp(x[, cols, drop = FALSE], scale. = TRUE)
    list(score = p$x[, 1], share = p$sdev[1]^2 / length(cols))
  })
  members <- sapply(seq_len(ncol(x)), function(j) {
    own <- cor(x[, j], scores[[g[j]]]$score)^2
    others <- sapply(setdiff(1:3, g[j]), function(k) cor(x[, j], scores[[k]]$score)^2)
    sprintf('{"name":"%s","group":%d,"sharedWithOwn":%.17g,"sharedWithNext":%.17g,"unexplainedRatio":%.17g}',
      colnames(x)[j], g[j], own, max(others), (1 - own) / (1 - max(others)))
  })
  shares <- num(sapply(scores, function(s) s$share))
  summary <- sprintf('{"k":3,"firstComponentShare":%s,"members":[%s]}', shares, paste(members, collapse = ","))
  rows <- paste0("[", paste(apply(x, 1, num), collapse = ","), "]")
  sets <- c(sets, sprintf('"%s":{"columns":%s,"rows":%s,"runs":[%s],"groups":%s}', name, str(colnames(x)), rows, paste(runs, collapse = ","), summary))
}
json <- sprintf('{"producedBy":"%s, stats::cor, stats::hclust, stats::cutree, stats::prcomp","sources":{"mtcars":"Henderson & Velleman (1981), R datasets::mtcars","swiss":"Swiss fertility 1888, Mosteller & Tukey (1977), R datasets::swiss","longley":"Longley (1967), R datasets::longley"},"data":{%s}}',
  R.version.string, paste(sets, collapse = ","))
here <- dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE)))
writeLines(json, file.path(here, "fixtures", "variable_tree.json"))
