/** Font files imported for their URL (the build emits them with a content hash; see angular.json). */
declare module '*.woff2' {
  const url: string;
  export default url;
}
