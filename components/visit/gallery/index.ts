export { VisitGallery, type VisitGalleryProps } from "./visit-gallery";
export { attachmentPlace } from "./describe-attachment";
