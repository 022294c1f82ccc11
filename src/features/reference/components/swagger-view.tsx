/** swagger-ui-react and its stylesheet: a chunk of their own, fetched only by the API reference page. */
import SwaggerUI from 'swagger-ui-react';
import 'swagger-ui-react/swagger-ui.css';
import './swagger-theme.css';

export default function SwaggerView({ url }: { url: string }) {
  return <SwaggerUI url={url} docExpansion="list" defaultModelsExpandDepth={0} deepLinking={false} displayRequestDuration tryItOutEnabled={false} />;
}
